// Shared set-up for the browser tests: a static server on 127.0.0.1 (port 0)
// over dist/, Debian's Chromium through playwright-core, and the CLI.
import { spawn, execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync, existsSync, mkdirSync, rmSync, cpSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, dirname } from 'node:path';
import { fileURLToPath } from 'node:url';
import { before, after } from 'node:test';
import { chromium } from 'playwright-core';

export const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
export const dist = join(root, 'dist');
export const shots = join(root, 'tests', 'e2e', 'screenshots');

/**
 * Serves dist/ (or another folder) on 127.0.0.1 with an OS-chosen port;
 * resolves to { url, stop, log }: `log` lists every request answered, as
 * { method, path, status }, from the server's own log.
 */
export function serve(folder = dist) {
  if (!existsSync(join(dist, 'index.html'))) {
    throw new Error('dist/ is missing: run scripts/build-web.sh first');
  }
  return new Promise((resolve, reject) => {
    const server = spawn('python3', ['-m', 'http.server', '--bind', '127.0.0.1', '0'], {
      cwd: folder,
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let seen = '';
    const log = [];
    let pending = '';
    server.stderr.on('data', (chunk) => {
      pending += chunk.toString();
      const lines = pending.split('\n');
      pending = lines.pop();
      for (const line of lines) {
        const m = line.match(/"(\w+) (\S+) HTTP\/[\d.]+" (\d{3})/);
        if (m) log.push({ method: m[1], path: m[2], status: Number(m[3]) });
      }
    });
    const onData = (chunk) => {
      seen += chunk.toString();
      const m = seen.match(/port (\d+)/);
      if (m) {
        server.stdout.off('data', onData);
        resolve({
          url: `http://127.0.0.1:${m[1]}/`,
          stop: () => server.kill(),
          log,
        });
      }
    };
    // A crashed run must not leave the server behind.
    process.on('exit', () => server.kill());
    server.stdout.on('data', onData);
    server.on('error', reject);
    server.on('exit', (code) => reject(new Error(`static server exited with ${code}: ${seen}`)));
  });
}

/**
 * Serves a copy of dist/ at `subPath` of a fresh site (`tools/plumbline/`
 * tests publishing in a sub-folder); `change(dir)` may alter the copy first,
 * and the copy in `dir` may be changed while it is served (a new build).
 * Resolves to { url (the app's address), dir, stop, log (as serve's) }.
 */
export async function serveCopy({ subPath = '', change } = {}) {
  const site = mkdtempSync(join(tmpdir(), 'plumbline-site-'));
  const dir = join(site, subPath);
  cpSync(dist, dir, { recursive: true });
  change?.(dir);
  const server = await serve(site);
  return {
    url: server.url + subPath,
    dir,
    log: server.log,
    stop: () => {
      server.stop();
      rmSync(site, { recursive: true, force: true });
    },
  };
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
 * that leaves 127.0.0.1 is recorded (the context's, so the offline worker's
 * too), so a test can prove the page stays local. Options: `viewport`,
 * `colorScheme`, `serviceWorkers` ('allow' or 'block'), `address` (open
 * this instead of `url`, e.g. with a fragment), `wait: false` (do not wait
 * for results).
 */
export async function open(browser, url, options = {}) {
  const context = await browser.newContext({
    viewport: options.viewport ?? { width: 1024, height: 768 },
    colorScheme: options.colorScheme ?? 'light',
    serviceWorkers: options.serviceWorkers ?? 'allow',
  });
  context.setDefaultTimeout(8000);
  const page = await context.newPage();
  const foreign = [];
  const problems = [];
  context.on('request', (r) => {
    if (!r.url().startsWith(url) && !r.url().startsWith('data:') && !r.url().startsWith('blob:')) foreign.push(r.url());
  });
  page.on('pageerror', (e) => problems.push(String(e)));
  page.on('console', (m) => { if (m.type() === 'error') problems.push(m.text()); });
  await page.goto(options.address ?? url);
  if (options.wait !== false) {
    await page.getByRole('heading', { name: "At the organs' own height" }).waitFor();
    await whole(page);
  }
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

/**
 * Runs `plumbline record CSV --case CASE --json` (with any further
 * arguments, e.g. `--min-episode-s 60`) on a record file's text and a case;
 * `tableStatus` adds the status word the same command's table prints for
 * each followed target.
 */
export function recordWithCli(csvText, caseJson, args = []) {
  const dir = mkdtempSync(join(tmpdir(), 'plumbline-record-'));
  const csv = join(dir, 'record.csv');
  const file = join(dir, 'case.json');
  writeFileSync(csv, csvText);
  writeFileSync(file, caseJson);
  const run = (more) => execFileSync(cli(), ['record', csv, '--case', file, ...more, ...args], {
    encoding: 'utf8',
    maxBuffer: 64 * 1024 * 1024,
  });
  try {
    const exposure = JSON.parse(run(['--json']));
    // The table's status word for each followed target, as printed:
    // `  [BELOW] CPP at least 60 mmHg`.
    exposure.tableStatus = Object.fromEntries(run([]).split('\n')
      .map((line) => line.match(/^ {2}\[([A-Z ]+)\] ([^:]+)$/))
      .filter(Boolean)
      .map((m) => [m[2], m[1]]));
    return exposure;
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

/**
 * The set-up most test files share: one static server over dist/ and one
 * Chromium for the whole file. Returns an object whose `server` and
 * `chrome` are filled in before the first test.
 */
export function suite() {
  const env = {};
  before(async () => {
    env.server = await serve();
    env.chrome = await launch();
  });
  after(async () => {
    await env.chrome?.close();
    env.server?.stop();
  });
  return env;
}

/** Polls `probe` until it returns a truthy value (or throws after `ms`). */
export async function until(probe, what, ms = 15000) {
  const start = Date.now();
  let last;
  for (;;) {
    try {
      last = await probe();
      if (last) return last;
    } catch (e) {
      last = e;
    }
    if (Date.now() - start > ms) throw new Error(`timed out waiting for ${what}: ${last}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

/**
 * Waits until the whole screen is built: the answer and the quick path
 * are painted first, each organ in detail, the folds and the record just
 * after (the folds' section is there once they are).
 */
export async function whole(page) {
  await page.locator('section.folds').waitFor({ state: 'attached' });
}

/**
 * Waits until the screen is whole and what was typed is checked: the
 * screen checks once typing pauses, and marks the answer as updating
 * until then.
 */
export async function settled(page) {
  await whole(page);
  await page.locator('.answer-pin[aria-busy="false"]').waitFor({ state: 'attached' });
}

/**
 * The page's "case as JSON" of what was typed (opening its panel without
 * moving the focus, once the check has caught up with the typing).
 */
export async function caseJsonOf(page) {
  await settled(page);
  await page.locator('.case-json details').evaluate((d) => { d.open = true; });
  return page.getByRole('textbox', { name: 'Case as JSON' }).inputValue();
}

/**
 * Opens the folded section of the inputs whose title starts with `title`
 * (a tap on its summary), and returns it.
 */
export async function unfold(page, title) {
  const fold = page.locator('details.fold').filter({
    has: page.locator(':scope > summary', { hasText: title }),
  });
  if (!(await fold.evaluate((d) => d.open))) await fold.locator(':scope > summary').click();
  return fold;
}

/**
 * The boxes one types into or picks from (inputs, selects, text areas; not
 * the read-only ones) by the form they belong to: `loose` names those in
 * no form (after each keystroke Chromium's autofill reads every box of the
 * form typed into, and boxes in none as one form spanning the page),
 * `largest` is the most boxes one form holds.
 */
export function boxGroups(page) {
  return page.evaluate(() => {
    const boxes = [...document.querySelectorAll('input:not([readonly]), select, textarea:not([readonly])')];
    const counts = new Map();
    for (const b of boxes) if (b.form) counts.set(b.form, (counts.get(b.form) ?? 0) + 1);
    return {
      boxes: boxes.length,
      loose: boxes.filter((b) => !b.form).map((b) => b.id || b.outerHTML.slice(0, 80)),
      largest: Math.max(0, ...counts.values()),
    };
  });
}

/**
 * The n-th arterial source's card, unfolded with its separate systolic,
 * diastolic and mean boxes showing.
 */
export async function showSource(page, n = 1) {
  await unfold(page, 'Arterial sources');
  const card = page.getByRole('group', { name: new RegExp(`^Arterial source ${n}:`) });
  const boxes = card.locator('details.more').first();
  if (!(await boxes.evaluate((d) => d.open))) await boxes.locator(':scope > summary').click();
  return card;
}
