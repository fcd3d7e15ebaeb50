import { useQuery } from '@tanstack/react-query';
import { useEffect, useRef, useState } from 'react';
import { Link } from 'react-router-dom';
import type { AnswerView, AttemptView } from '../../../../shared/api/lab';
import type { ViewKey } from '../../../../shared/domain/frames';
import type { Drawing } from '../../../../shared/drawings/types';
import { END_NAME, planTopYSign, type Answer, type Prompt } from '../../../../shared/lab';
import { drawingQuery } from '../../drawing/api/get-drawing';
import { useAnswer, useAttempt, useFinishAttempt } from '../api/attempts';
import { QuizSheet, type SheetMark } from './quiz-sheet';

const VIEW_TITLE: Record<ViewKey, string> = {
  plan: 'Plan, from above',
  side_plus_y: 'Side elevation, seen from outside',
  side_minus_y: 'Side elevation, seen from outside (the other side)',
  end_short_hood: 'Short hood end, seen from outside',
  end_long_hood: 'Long hood end, seen from outside',
};

const seconds = (ms: number) => `${(ms / 1000).toFixed(1)} s`;

function firstOpen(a: AttemptView): number | null {
  const done = new Set(a.answers.map((x) => x.promptIndex));
  const i = a.prompts.findIndex((p) => !done.has(p.index));
  return i === -1 ? null : i;
}

/** Takes one attempt prompt by prompt; after each answer the right part lights up with the reason. */
export function QuizRunner({ attemptId }: { attemptId: string }) {
  const attempt = useAttempt(attemptId);
  const [shown, setShown] = useState<number | 'summary' | null>(null);
  const a = attempt.data;
  const opening = a ? (a.finishedAt ? 'summary' : (firstOpen(a) ?? 'summary')) : null;
  // Pin the prompt on screen: answering it must show its feedback, not jump to the next one.
  useEffect(() => {
    if (shown === null && opening !== null) setShown(opening);
  }, [shown, opening]);
  if (attempt.isPending) return <p className="text-xl">Loading the quiz…</p>;
  if (attempt.isError || !a) return <p role="alert" className="text-xl">{attempt.error?.message}</p>;
  const current = shown ?? opening ?? 'summary';
  const next = () => {
    const open = firstOpen(a);
    setShown(open === null ? 'summary' : open);
  };
  if (current === 'summary') return <Summary attempt={a} />;
  return <PromptStep key={current} attempt={a} prompt={a.prompts[current]} onNext={next} onStop={() => setShown('summary')} />;
}

function PromptStep({ attempt, prompt, onNext, onStop }: { attempt: AttemptView; prompt: Prompt; onNext(): void; onStop(): void }) {
  const drawing = useQuery(drawingQuery(prompt.unitTypeKey));
  const answer = useAnswer(attempt.id);
  const finish = useFinishAttempt(attempt.id);
  const done = attempt.answers.find((x) => x.promptIndex === prompt.index);
  const [tapped, setTapped] = useState<string | null>(null);
  const [zoom, setZoom] = useState<1 | 2 | 3>(1);
  const shownAt = useRef<number | null>(null);
  const nextRef = useRef<HTMLButtonElement>(null);
  const feedbackRef = useRef<HTMLDivElement>(null);
  const headingRef = useRef<HTMLHeadingElement>(null);

  // The clock starts when the prompt can be answered (its drawing is on screen).
  useEffect(() => {
    if (drawing.data && shownAt.current === null) {
      shownAt.current = performance.now();
      headingRef.current?.focus();
    }
  }, [drawing.data]);
  // After an answer: bring the verdict into view (below the drawings on a phone) and put the focus on Next.
  useEffect(() => {
    if (!done) return;
    feedbackRef.current?.scrollIntoView?.({ block: 'nearest' });
    nextRef.current?.focus({ preventScroll: true });
  }, [done]);

  const send = (ans: Answer, partId?: string) => {
    if (done || answer.isPending) return;
    if (partId) setTapped(partId);
    const ms = Math.max(0, Math.round(performance.now() - (shownAt.current ?? performance.now())));
    answer.mutate({ promptIndex: prompt.index, answer: ans, ms });
  };

  const marks: SheetMark[] = [];
  if (prompt.template === 'name_part' && !done) marks.push({ partIds: [prompt.partId], tone: 'ask' });
  if (done) {
    marks.push({ partIds: done.expected.partIds, tone: 'right' });
    if (!done.correct && tapped) marks.push({ partIds: [tapped], tone: 'wrong' });
  }
  const total = attempt.prompts.length;
  const answeredCount = attempt.answers.length;
  const last = answeredCount === total;

  return (
    <section className="space-y-4" aria-labelledby="prompt-heading">
      <header className="flex flex-wrap items-center gap-3">
        <p className="text-base font-bold text-graphite-2">
          {attempt.quizTitle} · Prompt {prompt.index + 1} of {total}
        </p>
        <p className="rounded-md border-2 border-graphite px-3 py-1 text-base font-bold" data-testid="f-position">
          F on the {END_NAME[prompt.frontEnd]} end
        </p>
        {!attempt.finishedAt && (
          <button
            type="button"
            className="btn ml-auto"
            onClick={() => finish.mutate(undefined, { onSuccess: onStop })}
            disabled={finish.isPending}
          >
            Stop here
          </button>
        )}
      </header>
      <h1 id="prompt-heading" ref={headingRef} tabIndex={-1} className="text-3xl font-bold outline-none" data-testid="prompt-text">
        {prompt.text}
      </h1>
      {drawing.isPending && <p>Loading the drawing…</p>}
      {drawing.isError && <p role="alert">{drawing.error.message}</p>}
      {drawing.data && (
        <div className="grid gap-4 lg:grid-cols-[1fr_20rem]">
          <div className="space-y-2">
            <div role="group" aria-label="Drawing size" className="flex items-center gap-1">
              <span className="label mb-0 mr-1">Size</span>
              {([1, 2, 3] as const).map((z) => (
                <button key={z} type="button" className={`btn min-h-10 px-3 text-base ${zoom === z ? 'bg-graphite text-paper hover:bg-graphite-2' : ''}`} aria-pressed={zoom === z} onClick={() => setZoom(z)}>
                  {z}×
                </button>
              ))}
            </div>
          <div className="space-y-3 overflow-x-auto">
            <div className="space-y-3" style={zoom > 1 ? { width: `${zoom * 100}%` } : undefined}>
              {prompt.views.map((v) => (
                <QuizSheet
                  key={v}
                  drawing={drawing.data}
                  view={v}
                  frontEnd={prompt.frontEnd}
                  title={VIEW_TITLE[v]}
                  marks={marks}
                  maxHeight={zoom > 1 ? undefined : prompt.views.length > 1 ? 230 : 340}
                  onTap={prompt.template === 'tap_part' && !done ? (part, at) => send({ template: 'tap_part', partId: part.id, point: at }, part.id) : undefined}
                />
              ))}
            </div>
          </div>
          </div>
          <aside className="space-y-3">
            {!done && <Choices prompt={prompt} drawing={drawing.data} disabled={answer.isPending} onAnswer={(a) => send(a)} />}
            {answer.isError && (
              <p role="alert" className="field-error">
                {answer.error.message}
              </p>
            )}
            {done && (
              <div ref={feedbackRef} className="scroll-mt-20 space-y-3">
                <Feedback done={done} />
                <button ref={nextRef} type="button" className="btn-primary w-full" onClick={onNext}>
                  {last ? 'See your score' : 'Next prompt'}
                </button>
              </div>
            )}
          </aside>
        </div>
      )}
    </section>
  );
}

function Choices({ prompt, drawing, disabled, onAnswer }: { prompt: Prompt; drawing: Drawing; disabled: boolean; onAnswer(a: Answer): void }) {
  switch (prompt.template) {
    case 'tap_part':
      return <p className="text-lg">Tap the part on the drawing; make the drawing larger with Size if the part is small (or focus a view, use the arrow keys, then Enter).</p>;
    case 'name_part':
      return (
        <fieldset className="space-y-2">
          <legend className="label">Its name</legend>
          {prompt.choices.map((c) => (
            <button key={c} type="button" className="btn w-full justify-start text-left" disabled={disabled} onClick={() => onAnswer({ template: 'name_part', label: c })}>
              {c}
            </button>
          ))}
        </fieldset>
      );
    case 'which_end':
      return (
        <fieldset className="space-y-2">
          <legend className="label">Pick the end</legend>
          {(['short_hood', 'long_hood'] as const).map((end) => (
            <button key={end} type="button" className="btn w-full" disabled={disabled} onClick={() => onAnswer({ template: 'which_end', end })}>
              The {END_NAME[end]} end
            </button>
          ))}
        </fieldset>
      );
    case 'which_side': {
      const top = planTopYSign(drawing) ?? 1;
      return (
        <fieldset className="space-y-2">
          <legend className="label">Pick the side</legend>
          <button type="button" className="btn w-full" disabled={disabled} onClick={() => onAnswer({ template: 'which_side', ySign: top })}>
            The upper side of the plan
          </button>
          <button type="button" className="btn w-full" disabled={disabled} onClick={() => onAnswer({ template: 'which_side', ySign: top === 1 ? -1 : 1 })}>
            The lower side of the plan
          </button>
        </fieldset>
      );
    }
  }
}

function Feedback({ done }: { done: AnswerView }) {
  return (
    <div role="status" className={`card space-y-2 border-l-8 p-4 ${done.correct ? 'border-l-ok' : 'border-l-federal'}`} data-testid="feedback" data-correct={done.correct}>
      <p className={`flex items-center gap-2 text-2xl font-bold ${done.correct ? 'text-ok' : 'text-federal'}`}>
        <span aria-hidden="true">{done.correct ? '✓' : '✗'}</span>
        {done.correct ? 'Right' : 'Not right'}
      </p>
      {!done.correct && done.given && (
        <p>
          <span className="font-bold">You chose:</span> {done.given}
        </p>
      )}
      <p>
        <span className="font-bold">The answer:</span> {done.expected.label}
        <span className="text-graphite-2"> (lit in green)</span>
      </p>
      <p className="text-base">{done.reason}</p>
    </div>
  );
}

function Summary({ attempt }: { attempt: AttemptView }) {
  const answers = new Map(attempt.answers.map((a) => [a.promptIndex, a]));
  const right = attempt.answers.filter((a) => a.correct).length;
  const totalMs = attempt.answers.reduce((n, a) => n + a.ms, 0);
  return (
    <section className="max-w-4xl space-y-4" aria-labelledby="summary-heading">
      <h1 id="summary-heading" className="text-3xl font-bold">
        {attempt.quizTitle}: {right} of {attempt.prompts.length} right
      </h1>
      <p className="text-lg" data-testid="score">
        Score {attempt.score ?? right} / {attempt.prompts.length} · {seconds(totalMs)} in all
      </p>
      <ol className="space-y-2">
        {attempt.prompts.map((p) => {
          const a = answers.get(p.index);
          return (
            <li key={p.index} className="card flex flex-wrap items-baseline gap-x-3 gap-y-1 p-3">
              <span aria-hidden="true" className={`text-xl font-bold ${a?.correct ? 'text-ok' : 'text-federal'}`}>
                {a ? (a.correct ? '✓' : '✗') : '–'}
              </span>
              <span className="font-bold">{p.text}</span>
              <span className="text-graphite-2">F on the {END_NAME[p.frontEnd]}</span>
              <span className="sr-only">{a ? (a.correct ? 'right' : 'not right') : 'not answered'}</span>
              {a && <span className="ml-auto text-graphite-2">{seconds(a.ms)}</span>}
              {a && !a.correct && <span className="w-full text-base">Answer: {a.expected.label}</span>}
            </li>
          );
        })}
      </ol>
      <div className="flex flex-wrap gap-3">
        <Link to="/lab" className="btn-primary">
          Back to the lab
        </Link>
        <Link to={`/lab/take/${attempt.quizId}`} className="btn">
          Take it again
        </Link>
      </div>
    </section>
  );
}
