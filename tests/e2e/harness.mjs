// Shared set-up for the browser tests: a static server on 127.0.0.1 (port 0)
// over dist/, Debian's Chromium through playwright-core, and the CLI.
import { spawn, execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync, existsSync, mkdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, dirname } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium } from 'playwright-core';

export const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
export const dist = join(root, 'dist');
export const shots = join(root, 'tests', 'e2e', 'screenshots');

/** Serves dist/ on 127.0.0.1 with an OS-chosen port; resolves to { url, stop }. */
export function serve() {
  if (!existsSync(join(dist, 'index.html'))) {
    throw new Error('dist/ is missing: run scripts/build-web.sh first');
  }
  return new Promise((resolve, reject) => {
    const server = spawn('python3', ['-m', 'http.server', '--bind', '127.0.0.1', '0'], {
      cwd: dist,
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let seen = '';
    const onData = (chunk) => {
      seen += chunk.toString();
      const m = seen.match(/port (\d+)/);
      if (m) {
        server.stdout.off('data', onData);
        resolve({
          url: `http://127.0.0.1:${m[1]}/`,
          stop: () => server.kill(),
        });
      }
    };
    // A crashed run must not leave the server behind.
    process.on('exit', () => server.kill());
    server.stdout.on('data', onData);
    server.stderr.on('data', () => {});
    server.on('error', reject);
    server.on('exit', (code) => reject(new Error(`static server exited with ${code}: ${seen}`)));
  });
}

/**
 * Debian's Chromium, headless, with no background traffic. playwright-core
 * gives every launch a fresh temporary profile (user-data-dir) of its own.
 */
export async function launch() {
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: [
      '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
      '--disable-background-networking', '--disable-component-update', '--disable-sync',
    ],
  });
  return { browser, close: () => browser.close() };
}

/**
 * Opens the app in a new page and waits for the first results. Every request
 * that leaves 127.0.0.1 is recorded, so a test can prove the page stays local.
 */
export async function open(browser, url, options = {}) {
  const context = await browser.newContext({
    viewport: options.viewport ?? { width: 1024, height: 768 },
    colorScheme: options.colorScheme ?? 'light',
  });
  context.setDefaultTimeout(8000);
  const page = await context.newPage();
  const foreign = [];
  const problems = [];
  page.on('request', (r) => {
    if (!r.url().startsWith(url) && !r.url().startsWith('data:')) foreign.push(r.url());
  });
  page.on('pageerror', (e) => problems.push(String(e)));
  page.on('console', (m) => { if (m.type() === 'error') problems.push(m.text()); });
  await page.goto(url);
  await page.getByRole('heading', { name: "At the organs' own height" }).waitFor();
  return { context, page, foreign, problems };
}

/**
 * The CLI binary, built once per run so it always has the same core as the
 * page (a debug build: the numbers are the same).
 */
let cliPath;
export function cli() {
  if (!cliPath) {
    execFileSync('cargo', ['build', '-q', '-p', 'plumbline-cli'], { cwd: root, stdio: 'inherit' });
    cliPath = join(process.env.CARGO_TARGET_DIR ?? join(root, 'target'), 'debug', 'plumbline');
  }
  return cliPath;
}

/** Runs `plumbline check FILE --json` on a case document. */
export function checkWithCli(caseJson) {
  const dir = mkdtempSync(join(tmpdir(), 'plumbline-case-'));
  const file = join(dir, 'case.json');
  writeFileSync(file, caseJson);
  try {
    return JSON.parse(execFileSync(cli(), ['check', file, '--json'], { encoding: 'utf8' }));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** Rounds as the core's table and the screen do: half away from zero. */
export function rounded(v) {
  const r = Math.sign(v) * Math.round(Math.abs(v));
  return String(r === 0 ? 0 : r);
}

export function screenshotPath(name) {
  mkdirSync(shots, { recursive: true });
  return join(shots, `${name}.png`);
}
