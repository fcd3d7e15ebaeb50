import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { can } from '../../../../shared/domain/roles';
import { meQuery } from '../api/me';
import { useMyQuizzes } from '../api/my-quizzes';
import { useQuizzes } from '../api/quizzes';

const pct = (x: number | null) => (x === null ? '—' : `${Math.round(x * 100)} %`);

/** The lab's start screen: the demonstration for everyone, your quizzes, and the trainer's own work. */
export function LabHome() {
  const me = useQuery(meQuery());
  const trainer = me.data ? can(me.data.role, 'train') : false;
  return (
    <div className="max-w-5xl space-y-6">
      <header className="space-y-1">
        <h1 className="text-3xl font-bold">Orientation lab</h1>
        <p className="text-lg text-graphite-2">How front, rear, left, right and the numbers 1, 2, 3 … follow the end that carries the F.</p>
      </header>
      <section aria-labelledby="teach-heading" className="grid gap-3 sm:grid-cols-2">
        <h2 id="teach-heading" className="sr-only">
          Teaching
        </h2>
        <Link to="flip" className="card block space-y-1 p-4 hover:bg-paper-2">
          <span className="block text-xl font-bold">Flip demonstration</span>
          <span className="block text-base text-graphite-2">Move the F from the short hood to the long hood and watch every name change; pin one part to see both of its names.</span>
        </Link>
        <Link to="present" className="card block space-y-1 p-4 hover:bg-paper-2">
          <span className="block text-xl font-bold">Presenter mode</span>
          <span className="block text-base text-graphite-2">Full screen and large type for a classroom; step through with the arrow keys, F moves the F.</span>
        </Link>
      </section>
      <MyQuizzes hideWhenEmpty={trainer} />
      {trainer && <TrainerQuizzes />}
    </div>
  );
}

function MyQuizzes({ hideWhenEmpty }: { hideWhenEmpty: boolean }) {
  const q = useMyQuizzes();
  // A trainer is seldom in a group; the section only shows when there is something to take.
  if (hideWhenEmpty && q.data?.items.length === 0) return null;
  return (
    <section aria-labelledby="mine-heading" className="space-y-2">
      <h2 id="mine-heading" className="text-2xl font-bold">
        Your quizzes
      </h2>
      {q.isPending && <p>Loading…</p>}
      {q.isError && <p role="alert">{q.error.message}</p>}
      {q.data && q.data.items.length === 0 && <p className="text-graphite-2">No quiz has been shared with a group you are in yet.</p>}
      {q.data && q.data.items.length > 0 && (
        <ul className="space-y-2">
          {q.data.items.map((row) => (
            <li key={row.id} className="card flex flex-wrap items-center gap-3 p-3">
              <div className="min-w-0 flex-1">
                <p className="text-lg font-bold">{row.title}</p>
                <p className="text-base text-graphite-2">
                  {row.groupName} · {row.promptCount} prompts · {row.attempts === 0 ? 'not taken yet' : `best ${pct(row.best)}`}
                </p>
              </div>
              {row.openAttemptId ? (
                <Link to={`attempts/${row.openAttemptId}`} className="btn-primary">
                  Carry on
                </Link>
              ) : (
                <Link to={`take/${row.id}`} className="btn-primary" aria-label={`Take ${row.title}`}>
                  {row.attempts === 0 ? 'Take it' : 'Take it again'}
                </Link>
              )}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}

function TrainerQuizzes() {
  const q = useQuizzes();
  return (
    <section aria-labelledby="build-heading" className="space-y-2">
      <div className="flex flex-wrap items-center gap-3">
        <h2 id="build-heading" className="text-2xl font-bold">
          Quizzes you run
        </h2>
        <Link to="quizzes/new" className="btn-primary ml-auto">
          Build a quiz
        </Link>
        <Link to="groups" className="btn">
          Groups
        </Link>
      </div>
      {q.isPending && <p>Loading…</p>}
      {q.isError && <p role="alert">{q.error.message}</p>}
      {q.data && q.data.items.length === 0 && <p className="text-graphite-2">No quizzes yet. Build one from prompt templates and share it with a group.</p>}
      {q.data && q.data.items.length > 0 && (
        <ul className="space-y-2 sm:hidden">
          {q.data.items.map((row) => (
            <li key={row.id} className="card space-y-2 p-3">
              <p className="text-lg font-bold">{row.title}</p>
              <p className="text-base text-graphite-2">
                {row.groupName ?? 'Draft, not shared'} · {row.promptCount} prompts · {row.attempts} attempts by {row.people} {row.people === 1 ? 'person' : 'people'}
              </p>
              <QuizActions id={row.id} title={row.title} />
            </li>
          ))}
        </ul>
      )}
      {q.data && q.data.items.length > 0 && (
        <div className="hidden overflow-x-auto sm:block">
          <table className="w-full min-w-[36rem] border-collapse text-left text-base">
            <thead>
              <tr className="border-b-2 border-graphite">
                <th className="py-2 pr-3">Quiz</th>
                <th className="py-2 pr-3">Shared with</th>
                <th className="py-2 pr-3">Prompts</th>
                <th className="py-2 pr-3">Taken</th>
                <th className="py-2">
                  <span className="sr-only">Actions</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {q.data.items.map((row) => (
                <tr key={row.id} className="border-b border-rule">
                  <td className="py-2 pr-3 font-bold">{row.title}</td>
                  <td className="py-2 pr-3">{row.groupName ?? <span className="text-graphite-2">Draft, not shared</span>}</td>
                  <td className="py-2 pr-3">{row.promptCount}</td>
                  <td className="py-2 pr-3">
                    {row.attempts} by {row.people} {row.people === 1 ? 'person' : 'people'}
                  </td>
                  <td className="py-2">
                    <QuizActions id={row.id} title={row.title} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}

function QuizActions({ id, title }: { id: string; title: string }) {
  return (
    <div className="flex flex-wrap gap-2 sm:justify-end">
      <Link to={`quizzes/${id}/results`} className="btn px-3" aria-label={`Results of ${title}`}>
        Results
      </Link>
      <Link to={`quizzes/${id}`} className="btn px-3" aria-label={`Edit ${title}`}>
        Edit
      </Link>
      <Link to={`take/${id}`} className="btn px-3" aria-label={`Try ${title}`}>
        Try
      </Link>
    </div>
  );
}
