// No poison pill: a saved check or a link that cannot be opened, or whose
// opening froze the page, is set aside with a notice and its raw text kept
// for download, and the app starts clean; what was saved before is kept.
//
//   1. a saved check whose opening did not finish last time (the app's
//      note of what it was opening is still there) is set aside unopened
//   2. a link whose opening did not finish is not opened again from the
//      address bar; the saved check opens instead
//   3. the worst known link (the demo's line repeated 120 times) gives a
//      usable page within 2 s at full speed, its text kept for download
//   4. the worst known saved check (the same 120 sources in the saved
//      boxes) gives a usable page within 2 s; the raw text is kept
//   5. a page that really froze on a link (closed while frozen): the next
//      start is usable within 2 s and keeps the link (set aside as
//      stalled; once the core refuses such documents at once, as refused).
//      A saved check is covered by 1: a closed frozen page can still write
//      to storage when its check ends, which would race a second step.
//
// "Usable" is waited for with a timeout, never measured: the headline of
// the screen, the notice, and a box that takes a keystroke.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync, existsSync } from 'node:fs';
import { deflateRawSync } from 'node:zlib';
import { join } from 'node:path';
import { suite, open, until, caseJsonOf, root, showSource, settled } from './harness.mjs';

const env = suite();

// The worst documents open at once only where the core caps what drives
// its cost (crates/core/src/limits.rs, another branch of the work); until
// then the first opening freezes, which test 5 covers.
const capped = existsSync(join(root, 'crates', 'core', 'src', 'limits.rs'))
  || 'the core does not cap arterial sources yet (no crates/core/src/limits.rs)';

const radial = (page) => showSource(page);
const ready = (page) => page.getByRole('heading', { name: "At the organs' own height" }).waitFor();

/** A fragment carrying `json` as a share link does (deflate, base64url). */
const fragmentOf = (json) => `p1.${deflateRawSync(Buffer.from(json)).toString('base64url')}`;

/** The demo case with its arterial line repeated `n` times. */
function manySources(n) {
  const demo = JSON.parse(readFileSync(join(root, 'examples', 'beach-chair.json'), 'utf8'));
  const line = demo.arterial[0];
  demo.arterial = Array.from({ length: n }, (_, i) => ({ ...line, id: `line ${i + 1}` }));
  return demo;
}

/** The page's own saved check with 120 sources in its boxes and case. */
function worstSaved(text) {
  const saved = JSON.parse(text);
  const source = saved.form.sources[0];
  saved.form.sources = Array.from({ length: 120 }, (_, i) => ({ ...structuredClone(source), id: `line ${i + 1}` }));
  saved.case.arterial = manySources(120).arterial;
  return JSON.stringify(saved);
}

/** The app's note of what it is opening, as it writes it. */
const note = (link) => (link ? `plumbline-opening 1\n${link}` : 'plumbline-opening 1');

/** Downloads the copy a notice offers; resolves to its text. */
async function downloaded(page, notice) {
  const [download] = await Promise.all([
    page.waitForEvent('download'),
    notice.getByRole('button', { name: 'Download the copy' }).click(),
  ]);
  return readFileSync(await download.path(), 'utf8');
}

/** A page that answers: the screen, and a box that takes a keystroke. */
async function usable(page, ms) {
  await page.getByRole('heading', { name: 'Plumbline', level: 1 }).waitFor({ timeout: ms });
  await (await radial(page)).getByLabel('Mean', { exact: true }).fill('88', { timeout: ms });
}

test('a saved check whose opening did not finish last time is set aside unopened', async () => {
  const { page, context, problems } = await open(env.chrome.browser, env.server.url);
  await (await radial(page)).getByLabel('Mean', { exact: true }).fill('83');
  const saved = await until(async () => {
    const text = await page.evaluate(() => localStorage.getItem('plumbline.state'));
    return text?.includes('"83"') && text;
  }, 'the check saved');
  // As the page leaves it when it froze while opening the saved check.
  await page.evaluate((text) => localStorage.setItem('plumbline.opening', text), note());
  await page.reload();
  await ready(page);
  const notice = page.getByRole('alert').filter({ hasText: 'The check saved on this device did not finish opening last time' });
  await notice.waitFor();
  assert.match(await notice.textContent(), /set aside unopened\. The demo case is shown instead\./);
  assert.equal(await downloaded(page, notice), saved, 'the raw text, byte for byte');
  await page.getByRole('note').filter({ hasText: 'Invented demo case' }).waitFor();
  // The note is gone once the screen is drawn, so the next start is plain.
  await until(async () => (await page.evaluate(() => localStorage.getItem('plumbline.opening'))) === null, 'the note cleared');
  await page.reload();
  await ready(page);
  const stalled = page.getByRole('alert').filter({ hasText: 'did not finish opening' });
  assert.equal(await stalled.count(), 0, 'folded under the earlier visits');
  await page.getByText('1 text that could not be used on an earlier visit').click();
  await stalled.waitFor();
  assert.deepEqual(problems, [], 'no script errors');
  await context.close();
});

test('a link whose opening did not finish is not opened again; the saved check opens', async () => {
  const { page, context, problems } = await open(env.chrome.browser, env.server.url);
  await (await radial(page)).getByLabel('Mean', { exact: true }).fill('84');
  await settled(page);
  await until(async () => (await page.evaluate(() => localStorage.getItem('plumbline.state')))?.includes('"84"'), 'the check saved');
  const fragment = `#${fragmentOf(JSON.stringify(manySources(3)))}`;
  // As the page leaves it when it froze while opening the link; the
  // link is still in the address bar when the page is opened again.
  await page.evaluate((text) => localStorage.setItem('plumbline.opening', text), note(fragment));
  await page.goto('about:blank');
  await page.goto(env.server.url + fragment);
  await ready(page);
  const notice = page.getByRole('alert').filter({ hasText: 'The link did not finish opening last time' });
  await notice.waitFor();
  assert.equal(await downloaded(page, notice), fragment);
  assert.equal(await (await radial(page)).getByLabel('Mean', { exact: true }).inputValue(), '84', 'the saved check, not the link');
  await until(async () => page.url() === env.server.url, 'the link gone from the address bar');
  assert.deepEqual(problems, [], 'no script errors');
  await context.close();
});

test('the worst known link gives a usable page within 2 s, its text kept', { skip: capped !== true && capped }, async () => {
  const fragment = `#${fragmentOf(JSON.stringify(manySources(120)))}`;
  const { page, context, problems } = await open(env.chrome.browser, env.server.url, { address: env.server.url + fragment, wait: false });
  await usable(page, 2000);
  const notice = page.getByRole('alert').filter({ hasText: 'The link could not be opened' });
  await notice.waitFor({ timeout: 2000 });
  assert.match(await notice.textContent(), /120 arterial sources/);
  assert.equal(await downloaded(page, notice), fragment);
  assert.deepEqual(problems, [], 'no script errors');
  await context.close();
});

test('the worst known saved check gives a usable page within 2 s, its text kept', { skip: capped !== true && capped }, async () => {
  const { page, context, problems } = await open(env.chrome.browser, env.server.url);
  // The page's own saved check, its boxes and case holding 120 sources.
  await (await radial(page)).getByLabel('Mean', { exact: true }).fill('85');
  const worst = worstSaved(await until(async () => {
    const text = await page.evaluate(() => localStorage.getItem('plumbline.state'));
    return text?.includes('"85"') && text;
  }, 'the check saved'));
  await page.evaluate((text) => localStorage.setItem('plumbline.state', text), worst);
  await page.reload({ waitUntil: 'commit' });
  await usable(page, 2000);
  const notice = page.getByRole('alert').filter({ hasText: 'The check saved on this device could not be read' });
  await notice.waitFor({ timeout: 2000 });
  assert.match(await notice.textContent(), /120/);
  assert.equal(await downloaded(page, notice), worst);
  assert.ok(JSON.parse(await caseJsonOf(page)).arterial.length < 10, 'the app started clean');
  assert.deepEqual(problems, [], 'no script errors');
  await context.close();
});

/**
 * Opens `address` in a new page of `context`, waits until the app has
 * started and is either drawn or stuck (its main thread silent for a
 * second: frozen in a check), and closes it whatever state it is in; then
 * opens the app again in the same context and waits until it is usable.
 */
async function afterFreeze(context, address) {
  const first = await context.newPage();
  const wasm = first.waitForResponse((r) => r.url().endsWith('.wasm'));
  first.goto(address).catch(() => {});
  await wasm;
  await until(() => Promise.race([
    first.evaluate(() => document.querySelector('h1') !== null),
    new Promise((r) => setTimeout(() => r('stuck'), 1000)),
  ]), 'the page drawn or stuck');
  await first.close({ runBeforeUnload: false });
  const page = await context.newPage();
  await page.goto(address, { waitUntil: 'commit' });
  await usable(page, 2000);
  return page;
}

test('a page that froze while opening a link starts usable the next time, the link kept', async () => {
  const { context, problems } = await open(env.chrome.browser, env.server.url);
  const fragment = `#${fragmentOf(JSON.stringify(manySources(120)))}`;
  const next = await afterFreeze(context, env.server.url + fragment);
  const link = next.getByRole('alert').filter({ hasText: /^The link (did not finish opening|could not be opened)/ });
  await link.waitFor({ timeout: 2000 });
  assert.equal(await downloaded(next, link), fragment);
  assert.deepEqual(problems, [], 'no script errors');
  await context.close();
});
