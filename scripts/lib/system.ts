import { spawnSync } from 'node:child_process';
import fs from 'node:fs';

/** Debian packages the two commands need, with how to tell whether each is there. */
const PACKAGES = {
  postgresql: () => fs.existsSync('/usr/lib/postgresql') && fs.readdirSync('/usr/lib/postgresql').some((v) => fs.existsSync(`/usr/lib/postgresql/${v}/bin/initdb`)),
  chromium: () => fs.existsSync('/usr/bin/chromium'),
} as const;
export type SystemPackage = keyof typeof PACKAGES;

/** Installs what is missing when running as root; otherwise stops with the exact command to run. */
export function ensurePackages(needed: SystemPackage[]): void {
  const missing = needed.filter((p) => !PACKAGES[p]());
  if (!missing.length) return;
  const isRoot = process.getuid?.() === 0;
  if (!isRoot) {
    console.error(`Hoodline needs these Debian packages: ${missing.join(' ')}\nInstall them with:\n\n  sudo apt-get update && sudo apt-get install -y ${missing.join(' ')}\n`);
    process.exit(1);
  }
  console.log(`Installing Debian packages: ${missing.join(' ')} ...`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  for (const args of [['update', '-q'], ['install', '-y', '-q', ...missing]]) {
    const r = spawnSync('apt-get', args, { stdio: ['ignore', 'inherit', 'inherit'], env });
    if (r.status !== 0) {
      console.error(`apt-get ${args.join(' ')} failed (exit ${r.status}).`);
      process.exit(1);
    }
  }
  const still = missing.filter((p) => !PACKAGES[p]());
  if (still.length) {
    console.error(`Still missing after apt-get: ${still.join(' ')}`);
    process.exit(1);
  }
}

/** Runs scripts/pg.sh with the given cluster settings. */
export function pg(cmd: 'start' | 'stop' | 'destroy' | 'status', env: Record<string, string>): number {
  const r = spawnSync('bash', ['scripts/pg.sh', cmd], { stdio: 'inherit', env: { ...process.env, ...env } });
  return r.status ?? 1;
}

/** Newest modification time under the given paths (files or folders). */
export function newestMtime(paths: string[]): number {
  let newest = 0;
  const walk = (p: string) => {
    if (!fs.existsSync(p)) return;
    const st = fs.statSync(p);
    if (st.isDirectory()) for (const e of fs.readdirSync(p)) walk(`${p}/${e}`);
    else newest = Math.max(newest, st.mtimeMs);
  };
  paths.forEach(walk);
  return newest;
}
