/**
 * npm run bench:canvas — how the drawing canvas holds up, and what the first screen costs.
 *
 * 1. Builds the bench page (bench/canvas.html, bench/vite.canvas.config.ts) into a temp folder, with
 *    the six-axle drawing from diagrams/ (or the invented sample when diagrams/ has none that loads).
 * 2. Opens it in Debian's Chromium (never a downloaded browser), pans the plan for ~3 s with no pins
 *    and ~3 s with 5,000 pins (three alternating 1 s rounds each), timing animation frames; prints the
 *    medians and their ratio (goal ≤ 2).
 * 3. Builds the real app into a temp folder (falls back to dist/ when that build fails) and sums the
 *    gzipped JavaScript its index.html loads up front (entry script + modulepreloads): the sign-in
 *    screen's cost (goal ≤ 250 KB). Konva must not be among it.
 */
import { chromium } from '@playwright/test';
import { createServer, type Server } from 'node:http';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { extname, join, normalize, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { gzipSync } from 'node:zlib';
import { build } from 'vite';
import { loadDrawingsFromDir } from '../server/drawings/load';
import type { Drawing } from '../shared/drawings/types';
import { sampleSixAxleDrawing } from './canvas-sample-drawing';

const ROOT = fileURLToPath(new URL('..', import.meta.url));
const PAN_MS = 3000;
const PINS = 5000;
const ROUNDS = 3;
const FRAME_RATIO_GOAL = 2.0;
const FIRST_SCREEN_GOAL_KB = 250;
const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  // Let frames run as fast as the work allows, so frame times measure the work, not the display's 60 Hz.
  '--disable-gpu-vsync',
  '--disable-frame-rate-limit',
];

function quantile(xs: number[], q: number): number {
  const s = [...xs].sort((a, b) => a - b);
  return s.length ? s[Math.min(s.length - 1, Math.floor(q * s.length))] : NaN;
}
const median = (xs: number[]): number => quantile(xs, 0.5);

function pickDrawing(): { drawing: Drawing; source: string } {
  try {
    const all = loadDrawingsFromDir();
    const six = all.get('six_axle_road') ?? [...all.values()].find((d) => d.axleCount === 6);
    if (six) return { drawing: six, source: `diagrams/${six.key}.svg` };
  } catch (e) {
    console.log(`diagrams/ did not load (${(e as Error).message.split('\n')[0]}); using the bench's sample drawing`);
  }
  return { drawing: sampleSixAxleDrawing(), source: 'bench sample drawing' };
}

const TYPES: Record<string, string> = { '.html': 'text/html', '.js': 'text/javascript', '.css': 'text/css', '.json': 'application/json', '.woff2': 'font/woff2', '.woff': 'font/woff', '.svg': 'image/svg+xml' };

function serve(dir: string): Promise<{ server: Server; url: string }> {
  const server = createServer((req, res) => {
    const path = normalize(decodeURIComponent(new URL(req.url ?? '/', 'http://x').pathname)).replace(/^([/\\])+/, '');
    const file = resolve(dir, path || 'canvas.html');
    if (!file.startsWith(resolve(dir)) || !existsSync(file)) {
      res.writeHead(404).end();
      return;
    }
    res.writeHead(200, { 'content-type': TYPES[extname(file)] ?? 'application/octet-stream' }).end(readFileSync(file));
  });
  return new Promise((ok) => server.listen(0, '127.0.0.1', () => ok({ server, url: `http://127.0.0.1:${(server.address() as { port: number }).port}/` })));
}

interface FrameResult {
  none: number;
  many: number;
  p95: [number, number];
  frames: [number, number];
  parts: [Record<string, number>, Record<string, number>];
}

async function framePart(tmp: string): Promise<FrameResult> {
  const { drawing, source } = pickDrawing();
  console.log(`drawing: ${drawing.name} (${source}), plan parts: ${drawing.views.find((v) => v.key === 'plan')?.parts.length}`);
  const out = join(tmp, 'bench');
  await build({ configFile: join(ROOT, 'bench/vite.canvas.config.ts'), build: { outDir: out, emptyOutDir: true }, logLevel: 'error' });
  writeFileSync(join(out, 'drawing.json'), JSON.stringify(drawing));

  const { server, url } = await serve(out);
  const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_ARGS });
  try {
    const page = await browser.newPage({ viewport: { width: 1280, height: 720 } });
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    await page.goto(url + 'canvas.html');
    await page.waitForFunction(() => !!window.hoodlineBench && document.querySelector('canvas') !== null, undefined, { timeout: 20000 });
    // Let the lazy canvas chunk settle and the drawing cache build.
    await page.waitForTimeout(500);
    const run = async (pins: number, ms: number) => {
      await page.evaluate((n) => window.hoodlineBench!.setPins(n), pins);
      await page.waitForTimeout(250);
      return page.evaluate((t) => window.hoodlineBench!.pan(t), ms);
    };
    // Alternate short runs so a busy machine slows both cases alike; pool the frames of each case.
    const pooled: [number[], number[]] = [[], []];
    for (let r = 0; r < ROUNDS; r++) {
      pooled[0].push(...(await run(0, PAN_MS / ROUNDS)).intervals);
      pooled[1].push(...(await run(PINS, PAN_MS / ROUNDS)).intervals);
    }
    const parts: [Record<string, number>, Record<string, number>] = [{}, {}];
    for (const [i, n] of [[0, 0], [1, PINS]] as const) {
      await page.evaluate((k) => window.hoodlineBench!.setPins(k), n);
      await page.waitForTimeout(250);
      parts[i] = await page.evaluate(() => window.hoodlineBench!.layerDrawMs(40));
    }
    // BENCH_SHOTS=dir keeps a screenshot of the panned plan with its pins.
    if (process.env.BENCH_SHOTS) await page.screenshot({ path: join(process.env.BENCH_SHOTS, 'canvas-5000-pins.png') });
    if (errors.length) throw new Error(`page errors: ${errors.join('; ')}`);
    return {
      none: median(pooled[0]),
      many: median(pooled[1]),
      p95: [quantile(pooled[0], 0.95), quantile(pooled[1], 0.95)],
      frames: [pooled[0].length, pooled[1].length],
      parts,
    };
  } finally {
    await browser.close();
    server.close();
  }
}

/** The scripts the built index.html loads before anything is lazy-loaded. */
function firstScreenScripts(distDir: string): string[] {
  const html = readFileSync(join(distDir, 'index.html'), 'utf8');
  const urls = new Set<string>();
  for (const tag of html.match(/<(script|link)\b[^>]*>/g) ?? []) {
    const isScript = tag.startsWith('<script') && /type=["']module["']/.test(tag);
    const isPreload = tag.startsWith('<link') && /rel=["']modulepreload["']/.test(tag);
    const src = /(?:src|href)=["']([^"']+)["']/.exec(tag)?.[1];
    if ((isScript || isPreload) && src && !/^https?:/.test(src)) urls.add(src);
  }
  return [...urls].map((u) => join(distDir, u.replace(/^\//, '')));
}

async function firstScreenPart(tmp: string): Promise<{ kb: number; files: number; konva: boolean; dist: string }> {
  let dist = join(tmp, 'app');
  try {
    await build({ configFile: join(ROOT, 'vite.config.ts'), root: ROOT, build: { outDir: dist, emptyOutDir: true }, logLevel: 'error' });
  } catch (e) {
    if (!existsSync(join(ROOT, 'dist/index.html'))) throw e;
    console.log(`app build failed (${(e as Error).message.split('\n')[0]}); measuring the existing dist/`);
    dist = join(ROOT, 'dist');
  }
  const files = firstScreenScripts(dist);
  let bytes = 0;
  let konva = false;
  for (const f of files) {
    const code = readFileSync(f);
    bytes += gzipSync(code, { level: 9 }).length;
    // Konva's source names its global and its Stage class; neither belongs in the first screen.
    if (/Konva\.Stage|konvajs|Konva warning/.test(code.toString('utf8'))) konva = true;
  }
  return { kb: bytes / 1024, files: files.length, konva, dist };
}

async function main(): Promise<void> {
  const tmp = mkdtempSync(join(tmpdir(), 'hoodline-bench-'));
  try {
    console.log(`machine: ${cpus().length} cores, load average ${loadavg().map((l) => l.toFixed(2)).join(' ')}`);
    const f = await framePart(tmp);
    const ratio = f.many / f.none;
    const part = (k: string): string => `${f.parts[0][k]?.toFixed(2)} / ${f.parts[1][k]?.toFixed(2)}`;
    console.log(`frames panned in ${PAN_MS / 1000} s: ${f.frames[0]} (no pins), ${f.frames[1]} (${PINS} pins); p95 frame ms ${f.p95[0].toFixed(1)} / ${f.p95[1].toFixed(1)}`);
    console.log(
      `per-frame pieces, ms (no pins / ${PINS} pins): React pan update ${part('react pan update')}, drawing layer ${part('drawing-layer')}, ` +
        `pins layer ${part('pins-layer')}, overlay layer ${part('overlay-layer')}`,
    );
    console.log(
      `canvas median frame ms: no pins ${f.none.toFixed(1)}, ${PINS} pins ${f.many.toFixed(1)}, ratio ${ratio.toFixed(2)} (goal <= ${FRAME_RATIO_GOAL.toFixed(1)})`,
    );
    const s = await firstScreenPart(tmp);
    console.log(
      `first screen JS gzip: ${s.kb.toFixed(1)} KB (goal <= ${FIRST_SCREEN_GOAL_KB} KB); ${s.files} file(s) from ${s.dist === join(ROOT, 'dist') ? 'dist/' : 'a fresh build'}, Konva in it: ${s.konva ? 'YES' : 'no'}`,
    );
    const ok = ratio <= FRAME_RATIO_GOAL && s.kb <= FIRST_SCREEN_GOAL_KB && !s.konva;
    console.log(ok ? 'bench: within goals' : 'bench: OUTSIDE GOALS');
    process.exitCode = ok ? 0 : 1;
  } finally {
    rmSync(tmp, { recursive: true, force: true });
  }
}

await main();
