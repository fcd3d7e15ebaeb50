import { describe, expect, it } from 'vitest';
import { summariseResults, type AttemptRecord, type StoredPrompt } from '../../shared/lab';

// Hand-built attempts so every expected figure is plain counting.
const expected = { label: 'x', partIds: [], instanceIds: [] };
const tap = (index: number, frontEnd: 'short_hood' | 'long_hood', text: string): StoredPrompt => ({
  index, template: 'tap_part', unitTypeKey: 'six_axle_road', frontEnd, kind: 'traction_motor', targetLabel: text, views: ['plan'], text, expected,
});
const end = (index: number, frontEnd: 'short_hood' | 'long_hood'): StoredPrompt => ({
  index, template: 'which_end', unitTypeKey: 'six_axle_road', frontEnd, ask: 'rear', views: ['plan'], text: 'Which end is the rear?', expected: { ...expected, end: 'short_hood' },
});
const prompts = [tap(0, 'long_hood', 'Tap the #2 traction motor.'), tap(1, 'short_hood', 'Tap the #1 traction motor.'), end(2, 'long_hood')];
const attempt = (id: string, personId: string, name: string, startedAt: string, answers: AttemptRecord['answers'], finished = true): AttemptRecord => ({
  attemptId: id, personId, personName: name, role: 'inspector', startedAt, finishedAt: finished ? startedAt : null, prompts, answers,
});

describe('quiz results', () => {
  const summary = summariseResults([
    attempt('a1', 'p1', 'Dana', '2025-01-01T10:00:00Z', [
      { promptIndex: 0, correct: false, ms: 4000, given: 'Tap the #5 traction motor.' },
      { promptIndex: 1, correct: true, ms: 2000 },
      { promptIndex: 2, correct: true, ms: 1000 },
    ]),
    attempt('a2', 'p1', 'Dana', '2025-01-02T10:00:00Z', [
      { promptIndex: 0, correct: true, ms: 3000 },
      { promptIndex: 1, correct: true, ms: 1500 },
      { promptIndex: 2, correct: true, ms: 500 },
    ]),
    attempt('a3', 'p2', 'Abe', '2025-01-01T11:00:00Z', [
      { promptIndex: 0, correct: false, ms: 6000 },
      { promptIndex: 2, correct: false, ms: 2500 },
    ], false),
  ]);

  it('lists people by name with their attempts newest first, scores and time per prompt', () => {
    expect(summary.people.map((p) => p.name)).toEqual(['Abe', 'Dana']);
    const dana = summary.people[1];
    expect(dana.attempts.map((a) => a.attemptId)).toEqual(['a2', 'a1']);
    expect(dana.attempts[1]).toMatchObject({ total: 3, answered: 3, correct: 2, totalMs: 7000 });
    expect(dana.attempts[1].prompts[0]).toMatchObject({ correct: false, ms: 4000, given: 'Tap the #5 traction motor.', frontEnd: 'long_hood' });
    expect(dana.best).toBe(1);
    const abe = summary.people[0];
    expect(abe.attempts[0]).toMatchObject({ answered: 2, correct: 0, totalMs: 8500 });
    expect(abe.attempts[0].prompts[1]).toMatchObject({ answered: false, ms: null });
    // An unfinished attempt gives no best score yet.
    expect(abe.best).toBeNull();
  });

  it('ranks the kinds of question most often missed, counting only answered prompts', () => {
    expect(summary.mostMissed.map((m) => [m.key, m.asked, m.wrong])).toEqual([
      ['tap_part|traction_motor|long_hood', 3, 2],
      ['which_end|rear|long_hood', 3, 1],
    ]);
    expect(summary.mostMissed[0].title).toBe('Tap the part: traction motor, F on the long hood');
    expect(summary.mostMissed[0].examples).toEqual(['Tap the #2 traction motor.']);
  });

  it('is empty for a quiz nobody took', () => {
    expect(summariseResults([])).toEqual({ people: [], mostMissed: [] });
  });
});
