import fs from 'node:fs';
import { describe, expect, it } from 'vitest';
import { routeTableMarkdown } from '../../server/route-docs';

describe('docs/api.md', () => {
  it('matches the server’s route table (run `npm run docs:api` after changing routes)', () => {
    expect(fs.readFileSync('docs/api.md', 'utf8')).toBe(routeTableMarkdown());
  });
});
