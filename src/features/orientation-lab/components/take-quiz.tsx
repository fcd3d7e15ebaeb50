import { useNavigate, useSearchParams } from 'react-router-dom';
import { Link } from 'react-router-dom';
import { useMyQuizzes } from '../api/my-quizzes';
import { useStartAttempt } from '../api/attempts';

/**
 * The page before a quiz: starting is a deliberate press (prompts are generated then). A `seed` in
 * the address fixes the prompts, so a class can work through the same sheet together.
 */
export function TakeQuiz({ quizId }: { quizId: string }) {
  const [params] = useSearchParams();
  const seedParam = params.get('seed');
  const seed = seedParam !== null && /^\d{1,10}$/.test(seedParam) ? Number(seedParam) : undefined;
  const mine = useMyQuizzes();
  const start = useStartAttempt();
  const navigate = useNavigate();
  const row = mine.data?.items.find((q) => q.id === quizId);
  return (
    <section className="card max-w-2xl space-y-3 p-5" aria-labelledby="take-heading">
      <h1 id="take-heading" className="text-3xl font-bold">
        {row?.title ?? 'Quiz'}
      </h1>
      {row && <p className="text-lg">{row.promptCount} prompts. The F is placed at random for each one; find it, then answer.</p>}
      <p className="text-base text-graphite-2">After each answer the right part lights up on the drawing with the reason. Your score and the time you take on each prompt are kept for your trainer.</p>
      {seed !== undefined && <p className="text-base text-graphite-2">Class sheet {seed}: everyone starting with this sheet gets the same prompts.</p>}
      {start.isError && (
        <p role="alert" className="field-error">
          {start.error.message}
        </p>
      )}
      <div className="flex gap-3">
        <button
          type="button"
          className="btn-primary"
          disabled={start.isPending}
          onClick={() => start.mutate({ quizId, ...(seed !== undefined ? { seed } : {}) }, { onSuccess: (a) => navigate(`/lab/attempts/${a.id}`, { replace: true }) })}
        >
          Start the quiz
        </button>
        <Link to="/lab" className="btn">
          Not now
        </Link>
      </div>
    </section>
  );
}
