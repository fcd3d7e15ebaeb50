import { Link } from 'react-router-dom';
import { ROLE_LABELS, type Role } from '../../../../shared/domain/roles';
import { END_NAME } from '../../../../shared/lab/words';
import { useQuizResults } from '../api/results';

const seconds = (ms: number | null) => (ms === null ? '—' : `${(ms / 1000).toFixed(1)} s`);
const pct = (x: number | null) => (x === null ? '—' : `${Math.round(x * 100)} %`);
const when = (iso: string) => new Date(iso).toLocaleString([], { dateStyle: 'medium', timeStyle: 'short' });

/** Per person, every attempt and every prompt with its time; and what people miss most. */
export function QuizResultsPage({ quizId }: { quizId: string }) {
  const r = useQuizResults(quizId);
  if (r.isPending) return <p>Loading results…</p>;
  if (r.isError) return <p role="alert">{r.error.message}</p>;
  const { quiz, people, mostMissed, notStarted } = r.data;
  return (
    <div className="max-w-5xl space-y-6">
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="text-3xl font-bold">Results: {quiz.title}</h1>
        <Link to="/lab" className="btn ml-auto">
          Back to the lab
        </Link>
      </div>
      <p className="text-lg text-graphite-2">
        {quiz.groupName ? `Shared with ${quiz.groupName}` : 'Draft, not shared'} · {quiz.promptCount} prompts · {quiz.attempts} attempts by {quiz.people}{' '}
        {quiz.people === 1 ? 'person' : 'people'}
      </p>

      <section aria-labelledby="missed-heading" className="space-y-2">
        <h2 id="missed-heading" className="text-2xl font-bold">
          Missed most
        </h2>
        {mostMissed.length === 0 ? (
          <p className="text-graphite-2">Nothing missed yet.</p>
        ) : (
          <ol className="space-y-2">
            {mostMissed.map((m) => (
              <li key={m.key} className="card p-3" data-testid="missed">
                <p className="text-lg font-bold">
                  {m.title}: {m.wrong} of {m.asked} wrong
                </p>
                <p className="text-base text-graphite-2">{m.examples.slice(0, 3).join(' · ')}</p>
              </li>
            ))}
          </ol>
        )}
      </section>

      <section aria-labelledby="people-heading" className="space-y-3">
        <h2 id="people-heading" className="text-2xl font-bold">
          By person
        </h2>
        {people.length === 0 && <p className="text-graphite-2">Nobody has taken it yet.</p>}
        {people.map((p) => (
          <article key={p.personId} className="card space-y-2 p-3" aria-label={p.name} data-testid="person-result">
            <h3 className="text-xl font-bold">
              {p.name} <span className="text-base font-normal text-graphite-2">· {ROLE_LABELS[p.role as Role] ?? p.role} · best {pct(p.best)}</span>
            </h3>
            {p.attempts.map((a) => (
              <details key={a.attemptId} open={a === p.attempts[0]}>
                <summary className="cursor-pointer text-base font-bold">
                  {when(a.startedAt)}: {a.correct} of {a.total} right{a.finishedAt ? '' : ' (not finished)'} · {seconds(a.totalMs)}
                </summary>
                <div className="overflow-x-auto">
                  <table className="mt-2 w-full min-w-[40rem] border-collapse text-left text-base">
                    <thead>
                      <tr className="border-b-2 border-graphite">
                        <th className="py-1 pr-2">#</th>
                        <th className="py-1 pr-2">Prompt</th>
                        <th className="py-1 pr-2">F on</th>
                        <th className="py-1 pr-2">Result</th>
                        <th className="py-1 pr-2">Answered</th>
                        <th className="py-1 text-right">Time</th>
                      </tr>
                    </thead>
                    <tbody>
                      {a.prompts.map((x) => (
                        <tr key={x.promptIndex} className="border-b border-rule align-top">
                          <td className="py-1 pr-2">{x.promptIndex + 1}</td>
                          <td className="py-1 pr-2">{x.text}</td>
                          <td className="py-1 pr-2">{END_NAME[x.frontEnd]}</td>
                          <td className={`py-1 pr-2 font-bold ${x.correct ? 'text-ok' : 'text-federal'}`}>{!x.answered ? '—' : x.correct ? '✓ right' : '✗ wrong'}</td>
                          <td className="py-1 pr-2">{x.answered && !x.correct ? `${x.given ?? ''} (answer: ${x.expected})` : x.answered ? x.given : ''}</td>
                          <td className="py-1 text-right">{seconds(x.ms)}</td>
                        </tr>
                      ))}
                    </tbody>
                  </table>
                </div>
              </details>
            ))}
          </article>
        ))}
        {notStarted.length > 0 && <p className="text-base text-graphite-2">Not started yet: {notStarted.map((m) => m.name).join(', ')}</p>}
      </section>
    </div>
  );
}
