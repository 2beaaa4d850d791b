// Plumbline's page against a bare Yew page built the same way, in one run,
// interleaved, in Debian's headless Chromium: download (gzip -9 and brotli
// of the first screen and of everything), time to the first result cold
// and warm at 4x CPU throttling, keystroke to paint at 1x and 4x with and
// without the benchmark's eight-hour record loaded. Prints a Markdown
// table; measures, asserts nothing. scripts/bench-web.sh builds both pages
// and the workload and runs this.
//
//   node tests/bench/web.mjs DIST BARE WORKLOAD_DIR [RUNS]
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { loadavg, cpus } from 'node:os';
import { brotliCompressSync, deflateRawSync, constants } from 'node:zlib';
import { execFileSync } from 'node:child_process';
import { serve, launch, showSource } from '../e2e/harness.mjs';

const [dist, bare, workload, runsArg] = process.argv.slice(2);
const RUNS = Number(runsArg ?? 10);
const KEYS = 15;

const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const p90 = (xs) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(xs.length * 0.9))];
// gzip -9 as scripts/test-web.sh counts it (GNU gzip, not zlib's).
const gz = (path) => execFileSync('gzip', ['-9c', path], { maxBuffer: 1 << 26 }).length;
const br = (b) => brotliCompressSync(b, { params: { [constants.BROTLI_PARAM_QUALITY]: 11 } }).length;

/** gzip and brotli bytes of `files` (names in `dir`). */
function bytes(dir, files) {
  let g = 0;
  let b = 0;
  for (const f of files) {
    g += gz(join(dir, f));
    b += br(readFileSync(join(dir, f)));
  }
  return { gzip: g, brotli: b };
}

// In every page: when the first result appears (a selector given per
// page), and for each keystroke the time from its keydown to the frame
// after the first DOM change it caused (rAF, then a message: after paint),
// and, in Plumbline, to the frame after the answer is no longer marked as
// updating (the check of what was typed, once typing pauses, painted).
const probe = (selector) => `(() => {
  const b = window.__bench = { first: null, keys: [], results: [] };
  const painted = (list, t0) => requestAnimationFrame(() => {
    const ch = new MessageChannel();
    ch.port1.onmessage = () => list.push(performance.now() - t0);
    ch.port2.postMessage(0);
  });
  const seen = () => {
    if (b.first === null && document.querySelector(${JSON.stringify(selector)})) {
      b.first = performance.now();
      b.fetched = performance.getEntriesByType('resource').map((r) => new URL(r.name).pathname.split('/').pop());
    }
  };
  new MutationObserver(seen).observe(document, { subtree: true, childList: true });
  let watching = null;
  let answering = null;
  addEventListener('keydown', (e) => {
    const t0 = e.timeStamp;
    watching?.disconnect();
    answering?.disconnect();
    const mo = watching = new MutationObserver(() => {
      mo.disconnect();
      painted(b.keys, t0);
    });
    mo.observe(document.body, { subtree: true, childList: true, characterData: true, attributes: true });
    const pin = document.querySelector('.answer-pin');
    if (!pin) return;
    let busy = false;
    const ao = answering = new MutationObserver(() => {
      const now = pin.getAttribute('aria-busy') === 'true';
      if (busy && !now) {
        ao.disconnect();
        painted(b.results, t0);
      }
      busy = now;
    });
    ao.observe(pin, { attributes: true, attributeFilter: ['aria-busy'] });
  }, true);
})();`;

const pages = {
  plumbline: { dir: dist, selector: '#h-verdicts', box: async (p) => (await showSource(p)).getByLabel('Mean', { exact: true }) },
  bare: { dir: bare, selector: 'h1', box: async (p) => p.getByLabel('Text') },
};

const loadBefore = loadavg()[0];
const chrome = await launch();
const servers = { plumbline: await serve(dist), bare: await serve(bare) };

/** A fresh context (empty caches, no worker) with the probe, throttled by `rate`. */
async function fresh(name, rate) {
  const context = await chrome.browser.newContext({ viewport: { width: 1024, height: 768 } });
  await context.addInitScript(probe(pages[name].selector));
  const page = await context.newPage();
  const cdp = await context.newCDPSession(page);
  await cdp.send('Emulation.setCPUThrottlingRate', { rate });
  return { context, page, cdp };
}

async function firstResult(page) {
  await page.waitForFunction(() => window.__bench?.first !== null, null, { timeout: 60000 });
  return page.evaluate(() => window.__bench.first);
}

/** Cold then warm start of `name` at 4x; the files the first screen fetched. */
async function starts(name) {
  const { context, page } = await fresh(name, 4);
  await page.goto(servers[name].url);
  const cold = await firstResult(page);
  const fetched = await page.evaluate(() => window.__bench.fetched);
  if (name === 'plumbline') {
    // Warm means from the offline worker's cache.
    await page.evaluate(() => navigator.serviceWorker.ready);
    await page.waitForFunction(() => Boolean(navigator.serviceWorker.controller));
  }
  await page.reload();
  const warm = await firstResult(page);
  await context.close();
  return { cold, warm, fetched: ['index.html', ...fetched] };
}

/** Keystroke-to-paint times in `name`'s box at `rate`, after `prepare`. */
async function keystrokes(name, rate, prepare) {
  const { context, page, cdp } = await fresh(name, 1);
  const address = name === 'plumbline' ? `${servers.plumbline.url}#${fragment}` : servers[name].url;
  await page.goto(address);
  await firstResult(page);
  await prepare?.(page);
  await cdp.send('Emulation.setCPUThrottlingRate', { rate });
  const box = await pages[name].box(page);
  await box.click();
  await page.keyboard.press('End');
  await page.evaluate(() => { window.__bench.keys = []; window.__bench.results = []; });
  for (let i = 0; i < KEYS; i += 1) {
    await page.keyboard.press(i % 2 === 0 ? 'Backspace' : (i % 4 === 1 ? '6' : '5'));
    await page.waitForFunction((n) => window.__bench.keys.length >= n, i + 1);
    if (name === 'plumbline') await page.waitForFunction((n) => window.__bench.results.length >= n, i + 1);
    // Each key alone: the check runs once typing pauses, and the record
    // is analysed 300 ms after it, so wait past that and for it to end.
    await page.waitForFunction(() => !document.querySelector('[aria-busy="true"]'), null, { timeout: 60000 });
    await page.waitForTimeout(350);
    await page.waitForFunction(() => !document.querySelector('[aria-busy="true"]'), null, { timeout: 60000 });
  }
  const times = await page.evaluate(() => ({ keys: window.__bench.keys, results: window.__bench.results }));
  await context.close();
  return times;
}

// The benchmark's case opens through a share link, the page's own way;
// its eight-hour record through the record panel's file input.
const caseJson = readFileSync(join(workload, 'case.json'));
const fragment = `p1.${deflateRawSync(caseJson).toString('base64url')}`;
const csv = readFileSync(join(workload, 'record.csv'));
const withRecord = async (page) => {
  await page.getByLabel('Open a record file (CSV)').setInputFiles({ name: 'eight-hours.csv', mimeType: 'text/csv', buffer: csv });
  await page.getByRole('region', { name: 'Whole body · MAP at the heart' }).waitFor({ timeout: 120000 });
  await page.waitForFunction(() => !document.querySelector('[aria-busy="true"]'), null, { timeout: 120000 });
};

const results = { plumbline: { cold: [], warm: [] }, bare: { cold: [], warm: [] } };
let firstScreen = {};
for (let i = 0; i < RUNS; i += 1) {
  for (const name of i % 2 === 0 ? ['bare', 'plumbline'] : ['plumbline', 'bare']) {
    const { cold, warm, fetched } = await starts(name);
    results[name].cold.push(cold);
    results[name].warm.push(warm);
    firstScreen[name] = [...new Set(fetched)].filter((f) => readdirSync(pages[name].dir).includes(f));
  }
  process.stderr.write(`bench-web: start ${i + 1}/${RUNS}\n`);
}

const typing = {};
for (const [label, name, rate, prepare] of [
  ['bare, 1x', 'bare', 1], ['case, 1x', 'plumbline', 1],
  ['bare, 4x', 'bare', 4], ['case, 4x', 'plumbline', 4],
  ['record, 1x', 'plumbline', 1, withRecord], ['record, 4x', 'plumbline', 4, withRecord],
]) {
  typing[label] = await keystrokes(name, rate, prepare);
  process.stderr.write(`bench-web: keystrokes ${label}\n`);
}

await chrome.close();
servers.plumbline.stop();
servers.bare.stop();

const all = (dir) => readdirSync(dir);
const size = {
  plumbline: { first: bytes(dist, firstScreen.plumbline), all: bytes(dist, all(dist)) },
  bare: { first: bytes(bare, firstScreen.bare), all: bytes(bare, all(bare)) },
};
const kb = (n) => `${(n / 1000).toFixed(1)} KB`;
const ms = (n) => `${n.toFixed(0)} ms`;
const ratio = (a, b) => `${(a / b).toFixed(2)}×`;
const row = (what, p, b, f) => `| ${what} | ${f(p)} | ${f(b)} | ${ratio(p, b)} |`;
const keyRow = (what, xs, base) => `| ${what} | ${xs.length ? `${median(xs).toFixed(1)} ms (p90 ${p90(xs).toFixed(1)})` : '-'} | ${base ? `${median(base).toFixed(1)} ms (p90 ${p90(base).toFixed(1)})` : '-'} | ${base ? ratio(median(xs), median(base)) : '-'} |`;

console.log(`Web benchmark: ${RUNS} interleaved cold and warm starts each, ${KEYS} keystrokes each; medians.`);
console.log(`Machine: ${cpus().length} cores, load average ${loadBefore.toFixed(1)} at the start and ${loadavg()[0].toFixed(1)} at the end (other work slows both pages alike; read the ratios).`);
console.log(`First screen: Plumbline ${firstScreen.plumbline.join(', ')}; bare ${firstScreen.bare.join(', ')}.\n`);
console.log('| measure | Plumbline | bare Yew | ratio |');
console.log('|---|---:|---:|---:|');
console.log(row('first screen, gzip -9', size.plumbline.first.gzip, size.bare.first.gzip, kb));
console.log(row('first screen, brotli', size.plumbline.first.brotli, size.bare.first.brotli, kb));
console.log(row('everything, gzip -9', size.plumbline.all.gzip, size.bare.all.gzip, kb));
console.log(row('everything, brotli', size.plumbline.all.brotli, size.bare.all.brotli, kb));
console.log(row('first result, cold, 4x CPU', median(results.plumbline.cold), median(results.bare.cold), ms));
console.log(row('first result, warm (offline cache; bare: HTTP cache), 4x CPU', median(results.plumbline.warm), median(results.bare.warm), ms));
const key = (label) => typing[label].keys;
console.log(keyRow('keystroke to paint, 1x', key('case, 1x'), key('bare, 1x')));
console.log(keyRow('keystroke to paint, 4x', key('case, 4x'), key('bare, 4x')));
console.log(keyRow('keystroke to paint, 1x, eight-hour record', key('record, 1x'), key('bare, 1x')));
console.log(keyRow('keystroke to paint, 4x, eight-hour record', key('record, 4x'), key('bare, 4x')));
// The answer follows once typing pauses (the pause is in these times).
const result = (label) => typing[label].results;
console.log(keyRow('keystroke to its checked answer painted, 1x', result('case, 1x')));
console.log(keyRow('keystroke to its checked answer painted, 4x', result('case, 4x')));
console.log(keyRow('keystroke to its checked answer painted, 4x, eight-hour record', result('record, 4x')));
