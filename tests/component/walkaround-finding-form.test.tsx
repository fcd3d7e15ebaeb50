import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { defectTypesFor } from '../../shared/defects/catalogue';
import { FindingForm, type FindingTarget } from '../../src/features/walkaround/components/finding-form';

// Typing with user-event is slow on a busy two-core machine; the default 5 s is too tight.
vi.setConfig({ testTimeout: 30_000 });

// The defect types the server lists for a pilot (GET /api/defect-types?partKind=pilot), from the shared catalogue.
const PILOT_TYPES = defectTypesFor('pilot').map((d) => ({
  key: d.key,
  label: d.label,
  partKind: d.partKind,
  weight: d.weight,
  ...(d.rule ? { rule: d.rule, ruleConfidence: d.ruleConfidence } : {}),
  ...(d.check ? { check: d.check, checkPreset: d.checkPreset, measurement: d.measurement } : {}),
}));

const TARGET: FindingTarget = {
  partId: 'pl-pilot_sh',
  instanceId: 'pilot_sh',
  kind: 'pilot',
  label: 'Front pilot',
  view: 'plan',
  at: { u: 6, v: 0 },
  centre: { x: 6, y: 0, z: 10 },
};

type Handler = (url: string, init: RequestInit) => { status: number; body: unknown } | Promise<{ status: number; body: unknown }>;
let findingPosts: Record<string, unknown>[];
let onFinding: Handler;

function json(status: number, body: unknown) {
  return new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
}

beforeEach(() => {
  findingPosts = [];
  onFinding = () => ({ status: 500, body: { error: { code: 'internal', message: 'not set' } } });
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
      const url = String(input);
      if (url.startsWith('/api/defect-types')) return json(200, { items: PILOT_TYPES });
      if (url.endsWith('/findings') && init.method === 'POST') {
        findingPosts.push(JSON.parse(String(init.body)));
        const r = await onFinding(url, init);
        return json(r.status, r.body);
      }
      if (url.startsWith('/api/inspections/')) return json(404, { error: { code: 'not_found', message: 'no' } });
      throw new Error(`unexpected fetch ${url}`);
    }),
  );
});
afterEach(() => vi.unstubAllGlobals());

function renderForm(onClose = vi.fn()) {
  const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  render(
    <QueryClientProvider client={qc}>
      <FindingForm inspectionId="0b0e8f7e-1c1d-4a43-9d5a-7d3e2f1a0b01" target={TARGET} humpStencilled={false} timeZone="America/Chicago" onClose={onClose} />
    </QueryClientProvider>,
  );
  return { onClose, user: userEvent.setup() };
}

const storedFinding = (over: Record<string, unknown> = {}) => ({
  id: '6c1f1f8e-8f0e-4a53-9b1d-1a2b3c4d5e6f',
  label: 'Front pilot',
  defectLabel: 'Pilot height above rail out of limit',
  weight: 'federal',
  rule: '49 CFR 229.123',
  photos: [],
  ...over,
});

async function choosePilotHeight(user: ReturnType<typeof userEvent.setup>) {
  await user.click(await screen.findByRole('radio', { name: /Pilot height above rail out of limit/ }));
}

describe('finding form: live rule check', () => {
  it('checks a pilot height in millimetres against 49 CFR 229.123(a) as it is typed', async () => {
    const { user } = renderForm();
    await choosePilotHeight(user);
    await user.click(screen.getByRole('radio', { name: 'mm' }));
    const reading = screen.getByLabelText('Reading');
    // 63.5 mm = 2.5 in exactly (1 in = 25.4 mm), below the 3 in minimum of 49 CFR 229.123(a).
    await user.type(reading, '63.5');
    let result = screen.getByTestId('check-result');
    expect(result).toHaveAttribute('data-result', 'fail');
    expect(result).toHaveTextContent('Fail: out of limit');
    expect(result).toHaveTextContent('3 in (76.2 mm) to 6 in (152.4 mm) above top of rail');
    expect(result).toHaveTextContent('49 CFR 229.123(a)');
    // 76.2 mm is exactly 3 in: at the limit, still within it.
    await user.clear(reading);
    await user.type(reading, '76.2');
    result = screen.getByTestId('check-result');
    expect(result).toHaveAttribute('data-result', 'pass');
    // Just below the edge: 76.1 mm.
    await user.clear(reading);
    await user.type(reading, '76.1');
    expect(screen.getByTestId('check-result')).toHaveAttribute('data-result', 'fail');
  });

  it('checks a pilot height in inches, at, just inside and just outside the 6 in maximum', async () => {
    const { user } = renderForm();
    await choosePilotHeight(user);
    expect(screen.getByRole('radio', { name: 'in' })).toBeChecked();
    const reading = screen.getByLabelText('Reading');
    for (const [typed, result] of [
      ['2.5', 'fail'],
      ['3', 'pass'],
      ['5.99', 'pass'],
      ['6', 'pass'],
      ['6.01', 'fail'],
    ] as const) {
      await user.clear(reading);
      await user.type(reading, typed);
      expect(screen.getByTestId('check-result'), `${typed} in`).toHaveAttribute('data-result', result);
    }
    expect(screen.getByTestId('check-result')).toHaveTextContent('Source: 49 CFR 229.123(a)');
  });

  it('shows each defect type with its weight as shape and word, and its rule', async () => {
    renderForm();
    const option = (await screen.findByRole('radio', { name: /Pilot height above rail out of limit/ })).closest('label')!;
    expect(within(option).getByText('Federal')).toBeInTheDocument();
    expect(option.querySelector('[data-weight="federal"] svg path')).not.toBeNull();
    expect(option).toHaveTextContent('49 CFR 229.123');
    const bent = screen.getByRole('radio', { name: /Pilot bent/ }).closest('label')!;
    expect(bent.querySelector('[data-weight="shop"] svg circle')).not.toBeNull();
  });
});

describe('finding form: sending', () => {
  it('asks to keep a reading within the limit as a note, then resends with keepAsNote and the same idempotency key', async () => {
    onFinding = (_u, init) => {
      const b = JSON.parse(String(init.body));
      if (!b.keepAsNote)
        return {
          status: 409,
          body: { error: { code: 'check_passed', message: 'The reading is within the limit', check: { result: 'pass', limit: '3 in (76.2 mm) to 6 in (152.4 mm) above top of rail', source: '49 CFR 229.123(a)' } } },
        };
      return { status: 201, body: storedFinding({ weight: 'note' }) };
    };
    const { user } = renderForm();
    await choosePilotHeight(user);
    await user.type(screen.getByLabelText('Reading'), '4');
    await user.click(screen.getByRole('button', { name: 'Pin the finding' }));
    const ask = await screen.findByRole('alertdialog', { name: 'Reading within the limit' });
    expect(ask).toHaveTextContent('Keep it as a note, or drop it?');
    expect(ask).toHaveTextContent('49 CFR 229.123(a)');
    await user.click(within(ask).getByRole('button', { name: 'Keep as a note' }));
    expect(await screen.findByTestId('finding-stored')).toHaveTextContent('Note');
    expect(findingPosts).toHaveLength(2);
    expect(findingPosts[0]).toMatchObject({ partId: 'pl-pilot_sh', view: 'plan', x: 6, y: 0, defectType: 'pilot_height_out_of_limit', measurement: { value: 4, unit: 'in' } });
    expect(findingPosts[0].keepAsNote).toBeUndefined();
    expect(findingPosts[1].keepAsNote).toBe(true);
    expect(findingPosts[1].idempotencyKey).toBe(findingPosts[0].idempotencyKey);
  });

  it('drops the reading when asked to', async () => {
    onFinding = () => ({ status: 409, body: { error: { code: 'check_passed', message: 'within', check: { result: 'pass', limit: 'x', source: 'y' } } } });
    const { user, onClose } = renderForm();
    await choosePilotHeight(user);
    await user.type(screen.getByLabelText('Reading'), '4');
    await user.click(screen.getByRole('button', { name: 'Pin the finding' }));
    await user.click(await screen.findByRole('button', { name: 'Drop it' }));
    expect(onClose).toHaveBeenCalled();
    expect(findingPosts).toHaveLength(1);
  });

  it('puts the field errors of a 400 next to their fields', async () => {
    onFinding = () => ({
      status: 400,
      body: { error: { code: 'validation', message: 'The measurement is not valid', fields: { 'measurement.value': 'must be less than 100 in (2540 mm)', note: 'Too long for the record' } } },
    });
    const { user } = renderForm();
    await choosePilotHeight(user);
    await user.type(screen.getByLabelText('Reading'), '2');
    await user.type(screen.getByLabelText('Note'), 'low at the left rail');
    await user.click(screen.getByRole('button', { name: 'Pin the finding' }));
    const reading = screen.getByLabelText('Reading');
    await waitFor(() => expect(reading).toHaveAttribute('aria-invalid', 'true'));
    expect(document.getElementById(reading.getAttribute('aria-describedby')!)).toHaveTextContent('must be less than 100 in (2540 mm)');
    const note = screen.getByLabelText('Note');
    expect(document.getElementById(note.getAttribute('aria-describedby')!)).toHaveTextContent('Too long for the record');
    expect(screen.getByText('The measurement is not valid')).toBeInTheDocument();
  });

  it('asks for a defect type before sending anything', async () => {
    const { user } = renderForm();
    await screen.findByRole('radio', { name: /Pilot bent/ });
    await user.click(screen.getByRole('button', { name: 'Pin the finding' }));
    expect(await screen.findByText('Choose what is wrong')).toBeInTheDocument();
    expect(findingPosts).toHaveLength(0);
  });

  // With storage on the device the offline queue takes the finding (tests/unit/offline-queue.test.ts);
  // jsdom has no IndexedDB, which is the case of a device that cannot keep it.
  it('keeps the form when the connection drops and the device cannot keep the finding, and sends it again with the same key', async () => {
    let calls = 0;
    onFinding = () => {
      calls++;
      if (calls === 1) throw new TypeError('Failed to fetch');
      return { status: 201, body: storedFinding() };
    };
    const { user } = renderForm();
    await choosePilotHeight(user);
    await user.type(screen.getByLabelText('Reading'), '2.5');
    await user.click(screen.getByRole('button', { name: 'Pin the finding' }));
    expect(await screen.findByText(/No connection, and this device could not keep the finding; it stays in this form/)).toBeInTheDocument();
    expect(screen.getByLabelText('Reading')).toHaveValue('2.5');
    await user.click(screen.getByRole('button', { name: 'Send again' }));
    expect(await screen.findByTestId('finding-stored')).toHaveTextContent('Pinned: Front pilot');
    expect(findingPosts).toHaveLength(2);
    expect(findingPosts[1].idempotencyKey).toBe(findingPosts[0].idempotencyKey);
  });
});
