import { useEffect, useState, type FormEvent } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link, useNavigate } from 'react-router-dom';
import { CreateQuizBody, UpdateQuizBody } from '../../../../shared/api/lab';
import { PART_KINDS, type PartKind } from '../../../../shared/domain/parts';
import { MAX_PER_TEMPLATE, MAX_PROMPTS, ORIENTATION_KINDS, TEMPLATES, TEMPLATE_KEYS, type TemplateKey } from '../../../../shared/lab/templates';
import { ApiError } from '../../../lib/api-client';
import { useGroups } from '../api/groups';
import { quizQuery, useCreateQuiz, useUpdateQuiz } from '../api/quizzes';
import { useUnitTypes } from '../api/unit-types';
import { fieldErrors } from '../lib/form-errors';

interface Line {
  template: TemplateKey;
  count: number;
  kinds: PartKind[];
}

const DEFAULT_LINES: Line[] = [
  { template: 'tap_part', count: 4, kinds: [] },
  { template: 'name_part', count: 3, kinds: [] },
  { template: 'which_end', count: 2, kinds: [] },
  { template: 'which_side', count: 1, kinds: [] },
];

/** Build a quiz from prompt templates, or change one; sharing is choosing its group. */
export function QuizBuilder({ quizId }: { quizId?: string }) {
  const existing = useQuery({ ...quizQuery(quizId ?? ''), enabled: quizId !== undefined });
  const types = useUnitTypes();
  const groups = useGroups();
  const create = useCreateQuiz();
  const update = useUpdateQuiz();
  const navigate = useNavigate();
  const [title, setTitle] = useState('');
  const [unitTypeKey, setUnitTypeKey] = useState('');
  const [groupId, setGroupId] = useState('');
  const [lines, setLines] = useState<Line[]>(DEFAULT_LINES);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<string | null>(null);
  const [loaded, setLoaded] = useState(false);

  useEffect(() => {
    if (!existing.data || loaded) return;
    const q = existing.data;
    setTitle(q.title);
    setUnitTypeKey(q.unitTypeKey ?? '');
    setGroupId(q.groupId ?? '');
    setLines(q.templates.map((t) => ({ template: t.template, count: t.count, kinds: t.kinds ?? [] })));
    setLoaded(true);
  }, [existing.data, loaded]);

  const total = lines.reduce((n, l) => n + (Number.isFinite(l.count) ? l.count : 0), 0);
  const setLine = (i: number, patch: Partial<Line>) => setLines((ls) => ls.map((l, j) => (j === i ? { ...l, ...patch } : l)));

  const submit = (e: FormEvent) => {
    e.preventDefault();
    setMessage(null);
    const templates = lines.map((l) => ({ template: l.template, count: l.count, ...(l.kinds.length && TEMPLATES[l.template].usesKinds ? { kinds: l.kinds } : {}) }));
    const common = { title, unitTypeKey: unitTypeKey || null, templates, groupId: groupId || null };
    const onError = (err: unknown) => {
      setErrors(fieldErrors(err));
      setMessage(err instanceof ApiError ? err.message : 'The quiz could not be saved');
    };
    if (quizId && existing.data) {
      const parsed = UpdateQuizBody.safeParse({ version: existing.data.version, ...common });
      if (!parsed.success) return void setErrors(fieldErrors(parsed.error));
      update.mutate({ id: quizId, ...parsed.data }, { onSuccess: () => navigate('/lab'), onError });
    } else {
      const parsed = CreateQuizBody.safeParse(common);
      if (!parsed.success) return void setErrors(fieldErrors(parsed.error));
      create.mutate(parsed.data, { onSuccess: () => navigate('/lab'), onError });
    }
  };

  if (quizId && existing.isPending) return <p>Loading the quiz…</p>;
  if (quizId && existing.isError) return <p role="alert">{existing.error.message}</p>;
  const busy = create.isPending || update.isPending;

  return (
    <form onSubmit={submit} noValidate className="max-w-3xl space-y-5" aria-labelledby="builder-heading">
      <h1 id="builder-heading" className="text-3xl font-bold">
        {quizId ? 'Change the quiz' : 'Build a quiz'}
      </h1>
      <div>
        <label htmlFor="quiz-title" className="label">
          Title
        </label>
        <input id="quiz-title" className="field" value={title} onChange={(e) => setTitle(e.target.value)} aria-invalid={!!errors.title} aria-describedby="quiz-title-error" />
        {errors.title && (
          <p id="quiz-title-error" className="field-error">
            {errors.title}
          </p>
        )}
      </div>
      <div>
        <label htmlFor="quiz-type" className="label">
          Unit type
        </label>
        <select id="quiz-type" className="field" value={unitTypeKey} onChange={(e) => setUnitTypeKey(e.target.value)} aria-invalid={!!errors.unitTypeKey}>
          <option value="">Any unit type (picked at random for each prompt)</option>
          {types.data?.items.map((t) => (
            <option key={t.key} value={t.key}>
              {t.name}
            </option>
          ))}
        </select>
        {errors.unitTypeKey && <p className="field-error">{errors.unitTypeKey}</p>}
      </div>
      <fieldset className="space-y-3">
        <legend className="label">Prompts (the F is placed at random for each one)</legend>
        {lines.map((l, i) => (
          <div key={i} className="card space-y-3 p-3" data-testid="template-line">
            <div className="flex flex-wrap items-end gap-3">
              <div className="min-w-[12rem] flex-1">
                <label htmlFor={`tpl-${i}`} className="label">
                  Template
                </label>
                <select id={`tpl-${i}`} className="field" value={l.template} onChange={(e) => setLine(i, { template: e.target.value as TemplateKey })}>
                  {TEMPLATE_KEYS.map((k) => (
                    <option key={k} value={k}>
                      {TEMPLATES[k].title} — “{TEMPLATES[k].example}”
                    </option>
                  ))}
                </select>
              </div>
              <div className="w-28">
                <label htmlFor={`count-${i}`} className="label">
                  How many
                </label>
                <input
                  id={`count-${i}`}
                  type="number"
                  min={1}
                  max={MAX_PER_TEMPLATE}
                  className="field"
                  value={Number.isFinite(l.count) ? l.count : ''}
                  onChange={(e) => setLine(i, { count: e.target.value === '' ? NaN : Number(e.target.value) })}
                  aria-invalid={!!errors[`templates.${i}.count`]}
                />
              </div>
              <button type="button" className="btn-danger" onClick={() => setLines((ls) => ls.filter((_, j) => j !== i))} aria-label={`Remove prompt line ${i + 1}`}>
                Remove
              </button>
            </div>
            <p className="text-base text-graphite-2">{TEMPLATES[l.template].description}</p>
            {errors[`templates.${i}.count`] && <p className="field-error">{errors[`templates.${i}.count`]}</p>}
            {TEMPLATES[l.template].usesKinds && (
              <details>
                <summary className="cursor-pointer text-base font-bold">Parts to ask about: {l.kinds.length ? l.kinds.map((k) => PART_KINDS[k].plural).join(', ') : 'any part whose name follows the F'}</summary>
                <div className="mt-2 grid grid-cols-2 gap-1 sm:grid-cols-3">
                  {ORIENTATION_KINDS.map((k) => (
                    <label key={k} className="flex min-h-12 items-center gap-2 text-base">
                      <input
                        type="checkbox"
                        className="size-5"
                        checked={l.kinds.includes(k)}
                        onChange={(e) => setLine(i, { kinds: e.target.checked ? [...l.kinds, k] : l.kinds.filter((x) => x !== k) })}
                      />
                      {PART_KINDS[k].plural}
                    </label>
                  ))}
                </div>
              </details>
            )}
          </div>
        ))}
        {errors.templates && <p className="field-error">{errors.templates}</p>}
        <div className="flex flex-wrap items-center gap-3">
          <button type="button" className="btn" onClick={() => setLines((ls) => [...ls, { template: 'tap_part', count: 2, kinds: [] }])} disabled={lines.length >= 8}>
            Add a prompt line
          </button>
          <p className={total > MAX_PROMPTS ? 'font-bold text-federal' : 'text-graphite-2'}>
            {total} prompts (at most {MAX_PROMPTS})
          </p>
        </div>
      </fieldset>
      <div>
        <label htmlFor="quiz-group" className="label">
          Share with
        </label>
        <select id="quiz-group" className="field" value={groupId} onChange={(e) => setGroupId(e.target.value)} aria-invalid={!!errors.groupId}>
          <option value="">Nobody yet (a draft only trainers see)</option>
          {groups.data?.items.map((g) => (
            <option key={g.id} value={g.id}>
              {g.name} ({g.members.length})
            </option>
          ))}
        </select>
        {errors.groupId && <p className="field-error">{errors.groupId}</p>}
        <p className="mt-1 text-base text-graphite-2">
          No group yet? <Link to="/lab/groups" className="underline">Make one</Link>.
        </p>
      </div>
      {message && (
        <p role="alert" className="field-error">
          {message}
        </p>
      )}
      <div className="flex gap-3">
        <button type="submit" className="btn-primary" disabled={busy}>
          {quizId ? 'Save changes' : 'Save the quiz'}
        </button>
        <Link to="/lab" className="btn">
          Cancel
        </Link>
      </div>
    </form>
  );
}
