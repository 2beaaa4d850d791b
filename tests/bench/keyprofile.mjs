// Where a keystroke's time goes: a CPU profile of ten keystrokes in the
// first source's mean box of the benchmark's case, at CPU throttling RATE,
// optionally with the eight-hour record open; prints the busy time, self
// time by function (top 45) and inclusive time of the functions whose name
// holds PAT (default "plumbline"). Keys come 500 ms apart (each checked),
// or 40 ms apart with FAST=1 (a run of typing). DIST should be a build that
// keeps its names (wasm-bindgen --keep-debug, wasm-opt -g), WORKLOAD_DIR
// what scripts/bench-web.sh writes (case.json, record.csv). Measures only.
//
//   [FAST=1] [PAT=...] node tests/bench/keyprofile.mjs DIST WORKLOAD_DIR RATE [record]
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { deflateRawSync } from 'node:zlib';
import { serve, launch, showSource } from '../e2e/harness.mjs';

const [dist, workload, rateArg, withRecord] = process.argv.slice(2);
const rate = Number(rateArg ?? 1);
const chrome = await launch();
const server = await serve(dist);
const caseJson = readFileSync(join(workload, 'case.json'));
const fragment = `p1.${deflateRawSync(caseJson).toString('base64url')}`;
const context = await chrome.browser.newContext({ viewport: { width: 1024, height: 768 } });
const page = await context.newPage();
const cdp = await context.newCDPSession(page);
await page.goto(`${server.url}#${fragment}`);
await page.locator('#h-verdicts').waitFor();
if (withRecord) {
  const csv = readFileSync(join(workload, 'record.csv'));
  await page.getByLabel('Open a record file (CSV)').setInputFiles({ name: 'r.csv', mimeType: 'text/csv', buffer: csv });
  await page.getByRole('region', { name: 'Whole body · MAP at the heart' }).waitFor({ timeout: 120000 });
  await page.waitForFunction(() => !document.querySelector('[aria-busy="true"]'), null, { timeout: 120000 });
}
const box = (await showSource(page)).getByLabel('Mean', { exact: true });
await box.click();
await page.keyboard.press('End');
await cdp.send('Emulation.setCPUThrottlingRate', { rate });
await cdp.send('Profiler.enable');
await cdp.send('Profiler.setSamplingInterval', { interval: 100 });
await cdp.send('Profiler.start');
const t0 = Date.now();
for (let i = 0; i < 10; i += 1) {
  await page.keyboard.press(i % 2 === 0 ? 'Backspace' : '5');
  await page.waitForTimeout(process.env.FAST ? 40 : 500);
}
const { profile } = await cdp.send('Profiler.stop');
console.log(`wall ${Date.now() - t0} ms for 10 keys, waits included`);
const byId = new Map(profile.nodes.map((n) => [n.id, n]));
const self = new Map();
const dt = profile.timeDeltas;
for (let i = 0; i < profile.samples.length; i += 1) {
  const n = byId.get(profile.samples[i]);
  const name = `${n.callFrame.functionName || '(anon)'} ${n.callFrame.url.split('/').pop()}`;
  self.set(name, (self.get(name) ?? 0) + (dt[i] ?? 0) / 1000);
}
const busy = [...self].filter(([k]) => !k.startsWith('(idle)') && !k.startsWith('(program)'));
const total = busy.reduce((a, [, v]) => a + v, 0);
console.log(`busy ${total.toFixed(1)} ms`);
for (const [k, v] of busy.sort((a, b) => b[1] - a[1]).slice(0, 45)) console.log(`${v.toFixed(1).padStart(8)} ${k}`);
// Inclusive time per function name (counted once per sample).
const parent = new Map();
for (const n of profile.nodes) for (const c of n.children ?? []) parent.set(c, n.id);
const incl = new Map();
for (let i = 0; i < profile.samples.length; i += 1) {
  const seen = new Set();
  for (let id = profile.samples[i]; id !== undefined; id = parent.get(id)) {
    const f = byId.get(id).callFrame.functionName || '(anon)';
    if (seen.has(f)) continue;
    seen.add(f);
    incl.set(f, (incl.get(f) ?? 0) + (dt[i] ?? 0) / 1000);
  }
}
console.log('--- inclusive');
for (const [k, v] of [...incl].filter(([k]) => k.includes(process.env.PAT ?? 'plumbline')).sort((a, b) => b[1] - a[1]).slice(0, 60)) console.log(`${v.toFixed(1).padStart(8)} ${k}`);
await context.close();
await chrome.browser.close();
server.stop();
