import { expect, test, type Page } from '@playwright/test';
import { loadDrawingsFromDir } from '../../server/drawings/load';
import type { ViewKey } from '../../shared/domain/frames';
import { viewToSheet } from '../../shared/drawings/geometry';
import { placeFrontMarkings, tappableView } from '../../shared/drawings/screen-labels';
import type { ViewCoord } from '../../shared/drawings/types';
import type { AttemptView } from '../../shared/api/lab';
import { expectedFor, flipSteps, planTopYSign, type Prompt } from '../../shared/lab';
import { unitLayout } from '../../shared/layout/unit-layout';
import { resolveTap } from '../../src/features/orientation-lab/lib/resolve-tap';
import { signIn } from './helpers';

// The right (and the wrong) answers are worked out here with the shared engine from the prompts the
// page shows; the seed in the address only makes the run repeatable.
const drawings = loadDrawingsFromDir('diagrams');
const SEED = 4242;

async function signOut(page: Page) {
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page.getByRole('button', { name: 'Sign in' })).toBeVisible();
}

/** Screens at a tablet and a phone size; `focus` is what the screen itself scrolls to (the verdict after an answer). */
async function shot(page: Page, name: string, focus?: string) {
  for (const [w, h] of [
    [1024, 768],
    [390, 844],
  ] as const) {
    await page.setViewportSize({ width: w, height: h });
    await page.waitForTimeout(250);
    if (focus) await page.getByTestId(focus).scrollIntoViewIfNeeded();
    await page.screenshot({ path: `.tmp/screens/lab-${name}-${w}x${h}.png`, fullPage: false });
  }
  await page.setViewportSize({ width: 1024, height: 768 });
}

type Ctm = { a: number; b: number; c: number; d: number; e: number; f: number };

/** Each view's sheet-to-screen matrix as the page has it now. */
async function sheetMatrices(page: Page): Promise<Record<string, Ctm>> {
  return page.evaluate(() => {
    const out: Record<string, Ctm> = {};
    for (const svg of document.querySelectorAll<SVGSVGElement>('svg[data-view]')) {
      const m = svg.getScreenCTM();
      if (m) out[svg.dataset.view!] = { a: m.a, b: m.b, c: m.c, d: m.d, e: m.e, f: m.f };
    }
    return out;
  });
}

/**
 * A spot on a wanted part that a click really selects, by the sheet's own tap rule (its centre may be
 * covered by something drawn over it, so a grid of points over the part is tried).
 */
function clickable(p: Prompt, m: Record<string, Ctm>, want: (partId: string) => boolean): { view: ViewKey; at: ViewCoord } {
  const d = drawings.get(p.unitTypeKey)!;
  for (const vk of p.views) {
    const view = d.views.find((v) => v.key === vk)!;
    const tap = tappableView(view, placeFrontMarkings(d, vk, p.frontEnd));
    const scale = Math.hypot(m[vk].a, m[vk].b);
    for (const part of tap.parts) {
      if (!want(part.id)) continue;
      const { umin, umax, vmin, vmax } = part.bbox;
      // Inside the part, nearest the centre first; a point that only just resolves could land elsewhere after rounding.
      const grid: ViewCoord[] = [];
      for (let i = 1; i < 8; i++) for (let j = 1; j < 4; j++) grid.push({ u: umin + ((umax - umin) * i) / 8, v: vmin + ((vmax - vmin) * j) / 4 });
      grid.sort((a, b) => Math.hypot(a.u - part.centre.u, a.v - part.centre.v) - Math.hypot(b.u - part.centre.u, b.v - part.centre.v));
      for (const at of [part.centre, ...grid]) {
        const nudge = 1 / scale; // a pixel each way must still land on it
        const all = [at, { u: at.u + nudge, v: at.v }, { u: at.u - nudge, v: at.v }, { u: at.u, v: at.v + nudge }, { u: at.u, v: at.v - nudge }];
        if (all.every((q) => resolveTap(tap, q, scale)?.id === part.id)) return { view: vk, at };
      }
    }
  }
  throw new Error(`no clickable part for ${p.text}`);
}

async function answer(page: Page, p: Prompt, right: boolean) {
  const d = drawings.get(p.unitTypeKey)!;
  const e = expectedFor(p, d);
  switch (p.template) {
    case 'tap_part': {
      const layout = new Map(unitLayout(d, p.frontEnd).parts.map((x) => [x.partId, x]));
      const want = right
        ? (id: string) => e.partIds.includes(id)
        : (id: string) => layout.get(id)?.kind === p.kind && layout.get(id)?.label !== p.targetLabel;
      const first = clickable(p, await sheetMatrices(page), want);
      await page.locator(`svg[data-view="${first.view}"]`).scrollIntoViewIfNeeded();
      const m = (await sheetMatrices(page))[first.view];
      const s = viewToSheet(first.view, d.views.find((v) => v.key === first.view)!.sheet, first.at);
      await page.mouse.click(m.a * s.sx + m.c * s.sy + m.e, m.b * s.sx + m.d * s.sy + m.f);
      return;
    }
    case 'name_part': {
      const label = right ? e.label : p.choices.find((c) => c !== e.label)!;
      await page.getByRole('button', { name: label, exact: true }).click();
      return;
    }
    case 'which_end': {
      const end = right ? e.end! : e.end === 'short_hood' ? 'long_hood' : 'short_hood';
      await page.getByRole('button', { name: end === 'short_hood' ? 'The short hood end' : 'The long hood end' }).click();
      return;
    }
    case 'which_side': {
      const sign = right ? e.ySign! : -e.ySign!;
      await page.getByRole('button', { name: sign === planTopYSign(d) ? 'The upper side of the plan' : 'The lower side of the plan' }).click();
      return;
    }
  }
}

test('a trainer builds and shares a quiz; an inspector takes it, partly right and partly wrong; the trainer reads the results', async ({ page }) => {
  test.setTimeout(120_000);
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  const stamp = Date.now().toString(36);
  const groupName = `Class ${stamp}`;
  const title = `Which way is front ${stamp}`;

  // Trainer: a group with the demo inspector, then a quiz shared with it.
  await signIn(page, 'trainer');
  await page.goto('/lab');
  await expect(page.getByRole('heading', { level: 1, name: 'Orientation lab' })).toBeVisible();
  await page.getByRole('link', { name: 'Groups' }).click();
  await page.getByRole('button', { name: 'New group' }).click();
  await page.getByLabel('Group name').fill(groupName);
  await page.getByRole('checkbox', { name: /Dana Okafor/ }).check();
  await page.getByRole('button', { name: 'Create the group' }).click();
  await expect(page.getByText(groupName)).toBeVisible();

  await page.goto('/lab/quizzes/new');
  await page.getByLabel('Title').fill(title);
  await page.getByLabel('Unit type').selectOption('six_axle_road');
  const counts = [2, 2, 1, 1];
  for (const [i, n] of counts.entries()) await page.locator(`#count-${i}`).fill(String(n));
  await page.getByLabel('Share with').selectOption({ label: `${groupName} (1)` });
  // The same schema as the server checks the form: an empty title is refused before sending.
  await page.getByLabel('Title').fill('');
  await page.getByRole('button', { name: 'Save the quiz' }).click();
  await expect(page.getByText('Give the quiz a title')).toBeVisible();
  await page.getByLabel('Title').fill(title);
  await page.getByRole('button', { name: 'Save the quiz' }).click();
  await expect(page.getByRole('cell', { name: title, exact: true })).toBeVisible();
  await shot(page, 'trainer-home');
  await signOut(page);

  // Inspector: the quiz is listed; start it with a fixed seed.
  await signIn(page, 'inspector');
  await page.goto('/lab');
  const take = page.getByRole('link', { name: `Take ${title}` });
  await expect(take).toBeVisible();
  const href = (await take.getAttribute('href'))!;
  await page.goto(`${href.startsWith('/') ? href : `/lab/${href}`}?seed=${SEED}`);
  await page.getByRole('button', { name: 'Start the quiz' }).click();
  await expect(page).toHaveURL(/\/lab\/attempts\//);
  const attemptId = page.url().split('/').pop()!;
  const attempt = (await (await page.request.get(`/api/lab/attempts/${attemptId}`)).json()) as AttemptView;
  expect(attempt.prompts).toHaveLength(6);

  // Right, wrong, right, wrong …: partly right and partly wrong, across every template.
  const plan = attempt.prompts.map((_, i) => i % 2 === 0);
  for (const p of attempt.prompts) {
    await expect(page.getByTestId('prompt-text')).toHaveText(p.text);
    await expect(page.getByTestId('f-position')).toHaveText(`F on the ${p.frontEnd === 'short_hood' ? 'short hood' : 'long hood'} end`);
    if (p.index === 0) await shot(page, 'inspector-quiz');
    await answer(page, p, plan[p.index]);
    const fb = page.getByTestId('feedback');
    await expect(fb).toBeVisible();
    await expect(fb).toHaveAttribute('data-correct', String(plan[p.index]));
    await expect(fb).toContainText(/The F is on the (short|long) hood end/);
    // The right part lights up.
    if (expectedFor(p, drawings.get(p.unitTypeKey)!).partIds.length > 0) await expect(page.locator('[data-mark="right"]').first()).toBeAttached();
    if (p.index === 1) await shot(page, 'inspector-feedback', 'feedback');
    await page.getByRole('button', { name: p.index === attempt.prompts.length - 1 ? 'See your score' : 'Next prompt' }).click();
  }
  const right = plan.filter(Boolean).length;
  await expect(page.getByRole('heading', { name: `${title}: ${right} of 6 right` })).toBeVisible();
  await shot(page, 'inspector-summary');
  await signOut(page);

  // Trainer: per person, per prompt, and the most missed.
  await signIn(page, 'trainer');
  await page.goto('/lab');
  await page.getByRole('link', { name: `Results of ${title}` }).click();
  const dana = page.getByRole('article', { name: 'Dana Okafor' });
  await expect(dana).toContainText(`${right} of 6 right`);
  await expect(dana.getByRole('row')).toHaveCount(7);
  await expect(dana.getByText('✗ wrong')).toHaveCount(6 - right);
  await expect(page.getByTestId('missed').first()).toContainText('wrong');
  await shot(page, 'trainer-results');
  expect(errors).toEqual([]);
});

test('the flip demonstration moves the F and pins one part under both names', async ({ page }) => {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await signIn(page, 'trainer');
  await page.goto('/lab/flip');
  await page.getByLabel('Unit type').selectOption('six_axle_road');
  await expect(page.getByTestId('demo-front-end')).toContainText('short hood');
  const motor1 = page.locator('tr[data-instance="traction_motor_1"]');
  await motor1.getByRole('button', { name: /^Pin / }).click();
  // Instance ids count from the short hood end (diagrams/README.md): motor 1 is #1 or #6 by the F.
  await expect(page.getByTestId('pinned-short_hood')).toHaveText('#1 traction motor');
  await expect(page.getByTestId('pinned-long_hood')).toHaveText('#6 traction motor');
  await page.getByTestId('move-f').click();
  await expect(page.getByTestId('demo-front-end')).toContainText('long hood');
  await page.getByLabel('Step by step').check();
  await expect(page.getByTestId('step-panel')).toContainText('The F is stencilled on the long hood end');
  await shot(page, 'trainer-flip');
  expect(errors).toEqual([]);
});

test('presenter mode steps by keyboard, moves the F, and reads large', async ({ page }) => {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await signIn(page, 'trainer');
  await page.goto('/lab/present');
  const presenter = page.getByTestId('presenter');
  await expect(presenter).toBeVisible();
  // The first unit type the server lists is shown first.
  const types = (await (await page.request.get('/api/unit-types')).json()).items as { key: string }[];
  const d = drawings.get(types[0].key)!;
  const short = flipSteps(d, 'short_hood');
  const long = flipSteps(d, 'long_hood');
  await expect(page.getByTestId('presenter-step')).toHaveText(`Step 1 of ${short.length}`);
  await expect(page.getByTestId('presenter-title')).toHaveText(short[0].title);
  await page.keyboard.press('ArrowRight');
  await page.keyboard.press('PageDown');
  await expect(page.getByTestId('presenter-step')).toHaveText(`Step 3 of ${short.length}`);
  await expect(page.getByTestId('presenter-title')).toHaveText(short[2].title);
  await page.keyboard.press('f');
  await expect(page.getByTestId('presenter-front-end')).toHaveText('F on the long hood end');
  await expect(page.locator('section[aria-live]').getByText(long[2].body)).toBeVisible();
  await page.keyboard.press('ArrowLeft');
  await expect(page.getByTestId('presenter-title')).toHaveText(long[1].title);
  await page.keyboard.press('End');
  await expect(page.getByTestId('presenter-step')).toHaveText(`Step ${long.length} of ${long.length}`);
  await page.keyboard.press('Home');
  await expect(page.getByTestId('presenter-step')).toHaveText(`Step 1 of ${long.length}`);
  // Readable from the back of a room: the step title is set at 40 px or more.
  const px = await page.getByTestId('presenter-title').evaluate((el) => parseFloat(getComputedStyle(el).fontSize));
  expect(px).toBeGreaterThanOrEqual(40);
  await page.screenshot({ path: '.tmp/screens/lab-trainer-presenter-1024x768.png' });
  await page.keyboard.press('Escape');
  await expect(page.getByRole('heading', { level: 1, name: 'Orientation lab' })).toBeVisible();
  expect(errors).toEqual([]);
});
