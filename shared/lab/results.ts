import type { FrontEnd } from '../domain/frames';
import { PART_KINDS } from '../domain/parts';
import { TEMPLATES } from './templates';
import type { StoredPrompt } from './types';
import { END_NAME } from './words';

export interface AnswerRecord {
  readonly promptIndex: number;
  readonly correct: boolean;
  readonly ms: number;
  readonly given?: string;
}

export interface AttemptRecord {
  readonly attemptId: string;
  readonly personId: string;
  readonly personName: string;
  readonly role: string;
  readonly startedAt: string;
  readonly finishedAt: string | null;
  readonly prompts: readonly StoredPrompt[];
  readonly answers: readonly AnswerRecord[];
}

export interface PromptResult {
  readonly promptIndex: number;
  readonly text: string;
  readonly unitTypeKey: string;
  readonly frontEnd: FrontEnd;
  readonly expected: string;
  readonly answered: boolean;
  readonly correct: boolean;
  readonly ms: number | null;
  readonly given: string | null;
}

export interface AttemptSummary {
  readonly attemptId: string;
  readonly startedAt: string;
  readonly finishedAt: string | null;
  readonly total: number;
  readonly answered: number;
  readonly correct: number;
  /** Sum of time per answered prompt, ms. */
  readonly totalMs: number;
  readonly prompts: readonly PromptResult[];
}

export interface PersonResults {
  readonly personId: string;
  readonly name: string;
  readonly role: string;
  readonly attempts: readonly AttemptSummary[];
  /** Best share right over finished attempts, 0..1; null until one is finished. */
  readonly best: number | null;
}

/** A kind of question (template, part kind, F position) with how often it was answered and missed. */
export interface MissedConcept {
  readonly key: string;
  readonly title: string;
  readonly asked: number;
  readonly wrong: number;
  /** Prompt texts that were missed, most missed first. */
  readonly examples: readonly string[];
}

export interface QuizResultsSummary {
  readonly people: readonly PersonResults[];
  readonly mostMissed: readonly MissedConcept[];
}

function concept(p: StoredPrompt): { key: string; title: string } {
  const f = `F on the ${END_NAME[p.frontEnd]}`;
  const t = TEMPLATES[p.template].title;
  switch (p.template) {
    case 'tap_part':
    case 'name_part':
      return { key: `${p.template}|${p.kind}|${p.frontEnd}`, title: `${t}: ${PART_KINDS[p.kind].label}, ${f}` };
    case 'which_end':
    case 'which_side':
      return { key: `${p.template}|${p.ask}|${p.frontEnd}`, title: `${t}: the ${p.ask}, ${f}` };
  }
}

/** Per person (attempts newest first) and the most-missed kinds of question across everyone. */
export function summariseResults(attempts: readonly AttemptRecord[]): QuizResultsSummary {
  const byPerson = new Map<string, { name: string; role: string; attempts: AttemptSummary[] }>();
  const concepts = new Map<string, { title: string; asked: number; wrong: number; missed: Map<string, number> }>();
  for (const a of attempts) {
    const answers = new Map(a.answers.map((x) => [x.promptIndex, x]));
    const prompts: PromptResult[] = a.prompts.map((p) => {
      const ans = answers.get(p.index);
      if (ans) {
        const c = concept(p);
        const entry = concepts.get(c.key) ?? { title: c.title, asked: 0, wrong: 0, missed: new Map<string, number>() };
        entry.asked += 1;
        if (!ans.correct) {
          entry.wrong += 1;
          entry.missed.set(p.text, (entry.missed.get(p.text) ?? 0) + 1);
        }
        concepts.set(c.key, entry);
      }
      return {
        promptIndex: p.index,
        text: p.text,
        unitTypeKey: p.unitTypeKey,
        frontEnd: p.frontEnd,
        expected: p.expected.label,
        answered: ans !== undefined,
        correct: ans?.correct ?? false,
        ms: ans?.ms ?? null,
        given: ans?.given ?? null,
      };
    });
    const summary: AttemptSummary = {
      attemptId: a.attemptId,
      startedAt: a.startedAt,
      finishedAt: a.finishedAt,
      total: a.prompts.length,
      answered: prompts.filter((p) => p.answered).length,
      correct: prompts.filter((p) => p.correct).length,
      totalMs: prompts.reduce((n, p) => n + (p.ms ?? 0), 0),
      prompts,
    };
    const person = byPerson.get(a.personId) ?? { name: a.personName, role: a.role, attempts: [] };
    person.attempts.push(summary);
    byPerson.set(a.personId, person);
  }
  const people: PersonResults[] = [...byPerson.entries()]
    .map(([personId, p]) => {
      const attemptsNewest = [...p.attempts].sort((x, y) => y.startedAt.localeCompare(x.startedAt));
      const finished = attemptsNewest.filter((x) => x.finishedAt !== null && x.total > 0);
      const best = finished.length ? Math.max(...finished.map((x) => x.correct / x.total)) : null;
      return { personId, name: p.name, role: p.role, attempts: attemptsNewest, best };
    })
    .sort((x, y) => x.name.localeCompare(y.name));
  const mostMissed: MissedConcept[] = [...concepts.entries()]
    .filter(([, c]) => c.wrong > 0)
    .map(([key, c]) => ({
      key,
      title: c.title,
      asked: c.asked,
      wrong: c.wrong,
      examples: [...c.missed.entries()].sort((x, y) => y[1] - x[1] || x[0].localeCompare(y[0])).map(([text]) => text),
    }))
    .sort((x, y) => y.wrong - x.wrong || y.wrong / y.asked - x.wrong / x.asked || x.title.localeCompare(y.title));
  return { people, mostMissed };
}
