import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

// The lab keeps to its own tables (product brief: nothing done in the lab creates or changes
// inspection records, findings or units), and its core stays pure. Read from the source itself.
const read = (p: string) => readFileSync(p, 'utf8');
const INSPECTION_SIDE = ['units', 'inspections', 'findings', 'finding_events', 'inspection_items', 'photos', 'unit_tags', 'routines', 'unit_dates'];

describe('orientation lab separation', () => {
  it('imports only the lab tables (and people and yards, to name people) from the schema', () => {
    const repo = read('server/modules/lab/repository.ts');
    const m = repo.match(/import \{([^}]*)\} from '\.\.\/\.\.\/db\/schema'/);
    expect(m).not.toBeNull();
    const names = m![1].split(',').map((s) => s.trim()).filter(Boolean).sort();
    expect(names).toEqual(['people', 'quizAnswers', 'quizAttempts', 'quizzes', 'trainingGroupMembers', 'trainingGroups', 'yards']);
    for (const f of readdirSync('server/modules/lab')) {
      expect(read(join('server/modules/lab', f)), f).not.toMatch(/from '\.\.\/(units|walkaround|repairs)\//);
    }
  });

  it('names no inspection-side table in its SQL', () => {
    for (const f of readdirSync('server/modules/lab')) {
      const src = read(join('server/modules/lab', f));
      for (const sqlText of src.match(/sql`[^`]*`/g) ?? []) {
        for (const t of INSPECTION_SIDE) expect(sqlText, `${f}: ${t}`).not.toMatch(new RegExp(`\\b(from|join|into|update)\\s+${t}\\b`, 'i'));
      }
    }
  });

  it('keeps shared/lab free of React, DOM, Express, Drizzle and Konva', () => {
    for (const f of readdirSync('shared/lab')) {
      const src = read(join('shared/lab', f));
      expect(src, f).not.toMatch(/from '(react|react-dom|express|drizzle-orm[^']*|konva[^']*|react-konva)'/);
      expect(src, f).not.toMatch(/\b(document|window)\./);
    }
  });
});
