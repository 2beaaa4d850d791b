// Nothing lost: the check as typed and the theme survive a reload; every
// saved part that cannot be read is kept for download, beside the earlier
// ones, and the app still works; a record outlives its unreadable check;
// two windows never overwrite each other unasked; a new check can be undone.
//
//   1. a reload brings back every box as typed, mistakes and units included
//   2. an unreadable saved state: notice, raw copy downloaded, app works
//   3. every unreadable part (state, record, set-aside check and record)
//      has its own notice naming it and its own copy, kept beside the
//      earlier ones, never overwritten
//   4. the record over time survives an unreadable state
//   5. two windows: each sees the other's save, and is asked before one
//      overwrites the other; either choice loses nothing
//   6. a new check starts blank, with no results of the last one; undo
//   7. the stored envelope is our own, versioned, and lean
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { suite, open, until, caseJsonOf, screenshotPath, root, showSource, unfold, settled } from './harness.mjs';

const env = suite();

/** The keys of the texts kept for download. */
const rescuedKeys = (page) => page.evaluate(() => Object.keys(localStorage).filter((k) => k.startsWith('plumbline.unreadable')));

const radial = (page) => showSource(page);
const ready = (page) => page.getByRole('heading', { name: "At the organs' own height" }).waitFor();

test('a reload brings back every box as typed, mistakes, units and theme included', async () => {
  const { page, context, foreign, problems } = await open(env.chrome.browser, env.server.url);
  await (await radial(page)).getByLabel('Mean', { exact: true }).fill('81');
  await (await radial(page)).getByLabel('Systolic unit').selectOption('kPa');
  await unfold(page, 'Other pressures');
  await page.getByLabel('Pressure to add').selectOption({ label: 'ICP' });
  await page.getByRole('button', { name: 'Add measured' }).click();
  await page.getByRole('group', { name: 'ICP (measured)' }).getByLabel('ICP', { exact: true }).fill('16');
  await page.getByRole('button', { name: /^Theme: device/ }).click();
  await until(async () => JSON.parse(await caseJsonOf(page)).readings?.icp?.value === '16 mmHg', 'the ICP in the case');
  const good = await caseJsonOf(page);
  // A mistake is kept as typed too, with its message.
  await (await radial(page)).getByLabel('Diastolic', { exact: true }).fill('5o');
  await page.locator('#f-arterial-0-diastolic-msg').waitFor();

  await page.reload();
  await page.getByRole('heading', { name: 'Not checked: 1 entry needs attention' }).waitFor();
  assert.equal(await (await radial(page)).getByLabel('Diastolic', { exact: true }).inputValue(), '5o');
  assert.equal(await (await radial(page)).getByLabel('Mean', { exact: true }).inputValue(), '81');
  assert.equal(await (await radial(page)).getByLabel('Systolic unit').inputValue(), 'kPa');
  assert.equal(await (await radial(page)).getByLabel('Systolic', { exact: true }).inputValue(), '13.87');
  assert.equal(await page.evaluate(() => document.documentElement.dataset.theme), 'dark');
  await page.locator('#f-arterial-0-diastolic-msg').waitFor();

  await (await radial(page)).getByLabel('Diastolic', { exact: true }).fill('58');
  await ready(page);
  assert.equal(await caseJsonOf(page), good, 'the same case as before the reload');
  // Back in mmHg the typed original returns, not a rounded conversion.
  await (await radial(page)).getByLabel('Systolic unit').selectOption('mmHg');
  await until(async () => (await (await radial(page)).getByLabel('Systolic', { exact: true }).inputValue()) === '104', 'the typed systolic');
  assert.deepEqual(foreign, [], 'no request leaves 127.0.0.1');
  assert.deepEqual(problems, [], 'no script errors');
  await context.close();
});

test('an unreadable saved state is offered for download and the app still works', async () => {
  const { page, context, problems } = await open(env.chrome.browser, env.server.url);
  const broken = '{"format":"plumbline-state","version":1,"theme":"dark","case":{"format":"plumbline-cas';
  await page.evaluate((text) => localStorage.setItem('plumbline.state', text), broken);
  await page.reload();
  await ready(page);
  const notice = page.getByRole('alert').filter({ hasText: 'could not be read' });
  await notice.waitFor();
  assert.match(await notice.textContent(), /it is incomplete/);
  await page.getByRole('note').filter({ hasText: 'Invented demo case' }).waitFor();
  await page.screenshot({ path: screenshotPath('unreadable-notice') });

  const [download] = await Promise.all([
    page.waitForEvent('download'),
    notice.getByRole('button', { name: 'Download the copy' }).click(),
  ]);
  assert.equal(download.suggestedFilename(), 'plumbline-unreadable-state.txt');
  assert.equal(readFileSync(await download.path(), 'utf8'), broken, 'the raw copy, byte for byte');

  // The app works, and saves again.
  await (await radial(page)).getByLabel('Mean', { exact: true }).fill('79');
  await until(async () => JSON.parse(await caseJsonOf(page)).arterial[0].mean === '79 mmHg', 'the new mean');
  // The raw copy outlives a reload until it is discarded.
  await page.reload();
  await ready(page);
  assert.equal(await (await radial(page)).getByLabel('Mean', { exact: true }).inputValue(), '79');
  await page.getByText('1 text that could not be used on an earlier visit is kept on this device for download').click();
  await notice.waitFor();
  await notice.getByRole('button', { name: 'Discard it' }).click();
  await until(async () => (await rescuedKeys(page)).length === 0, 'the copy gone');
  await page.reload();
  await ready(page);
  assert.equal(await page.getByText('could not be read').count(), 0);
  assert.deepEqual(problems, [], 'no script errors');
  await context.close();
});

/** Downloads the copy a notice offers; resolves to its name and text. */
async function downloaded(page, notice) {
  const [download] = await Promise.all([
    page.waitForEvent('download'),
    notice.getByRole('button', { name: 'Download the copy' }).click(),
  ]);
  return [download.suggestedFilename(), readFileSync(await download.path(), 'utf8')];
}

/** The notices about texts kept for download, by their words. */
const alerts = (page) => page.getByRole('alert').allTextContents();

test('every unreadable part has its own notice and copy, kept beside the earlier ones', async () => {
  const { page, context, problems } = await open(env.chrome.browser, env.server.url);
  const broken = {
    'plumbline.state': '{"format":"plumbline-state","version":1,"theme":"da',
    'plumbline.record': '{"format":"plumbline-case","version":1,"timeline":4}',
    'plumbline.kept': '[1, 2]',
    'plumbline.kept.record': '{"format":"plumbline-case","version":9}',
  };
  await page.evaluate((texts) => { for (const [k, v] of Object.entries(texts)) localStorage.setItem(k, v); }, broken);
  await page.reload();
  await ready(page);
  const notices = {
    'plumbline.state': 'The check saved on this device could not be read (it is incomplete',
    'plumbline.record': 'The record over time saved with the check could not be read (timeline:',
    'plumbline.kept': 'The set-aside check could not be read (it is not a check saved by Plumbline).',
    'plumbline.kept.record': "The set-aside check's record over time could not be read (version: format version 9",
  };
  await until(async () => (await alerts(page)).length === 4, 'four notices');
  const files = new Set();
  for (const [key, words] of Object.entries(notices)) {
    const notice = page.getByRole('alert').filter({ hasText: words });
    const [name, text] = await downloaded(page, notice);
    assert.equal(text, broken[key], `${key}: the raw copy, byte for byte`);
    files.add(name);
  }
  assert.equal(files.size, 4, 'four file names');
  // Only the open check's parts say the demo is shown instead of them.
  const all = await alerts(page);
  const saying = (words) => all.filter((t) => t.includes(words)).map((t) => t.split(' could not')[0]).sort();
  assert.deepEqual(saying('The demo case is shown instead'), ['The check saved on this device', 'The record over time saved with the check']);
  assert.deepEqual(saying('The check on screen is unchanged'), ['The set-aside check', "The set-aside check's record over time"]);
  await page.getByRole('note').filter({ hasText: 'Invented demo case' }).waitFor();
  await page.screenshot({ path: screenshotPath('unreadable-parts'), fullPage: false });

  // The app saves again, and a second failure joins the first four.
  await (await radial(page)).getByLabel('Mean', { exact: true }).fill('79');
  // Saved once typing pauses, with the check.
  await settled(page);
  await until(async () => (await rescuedKeys(page)).length === 4, 'four copies kept');
  await until(async () => (await page.evaluate(() => localStorage.getItem('plumbline.state')))?.includes('"79"'), 'the new check saved');
  await page.evaluate(() => localStorage.setItem('plumbline.state', 'second failure'));
  await page.reload();
  await ready(page);
  await until(async () => (await alerts(page)).length === 1, "this visit's notice");
  // The earlier visits' copies are folded, and all there.
  await page.getByText('4 texts that could not be used on earlier visits are kept on this device for download').click();
  await until(async () => (await alerts(page)).length === 5, 'five notices');
  const second = page.getByRole('alert').filter({ hasText: 'it is incomplete, perhaps cut short or changed). The demo' });
  assert.equal((await downloaded(page, second))[1], 'second failure');
  const first = page.getByRole('alert').filter({ hasText: 'Kept from an earlier visit' }).filter({ hasText: 'The check saved on this device' });
  assert.equal((await downloaded(page, first))[1], broken['plumbline.state'], 'the first copy is not overwritten');
  assert.equal((await rescuedKeys(page)).length, 5);
  assert.deepEqual(problems, [], 'no script errors');
  await context.close();
});

test('the record over time survives an unreadable state', async () => {
  const { page, context, problems } = await open(env.chrome.browser, env.server.url);
  const csv = readFileSync(join(root, 'examples', 'beach-chair-record.csv'), 'utf8');
  await page.getByLabel('Open a record file (CSV)').setInputFiles({ name: 'record.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
  const summary = page.getByRole('region', { name: 'Record over time' }).locator('.record-summary');
  await until(async () => /^\d+ samples/.test(await summary.textContent()), 'the record');
  const samples = (await summary.textContent()).match(/^\d+ samples/)[0];
  const record = await until(() => page.evaluate(() => localStorage.getItem('plumbline.record')), 'the record saved');
  await page.evaluate(() => localStorage.setItem('plumbline.state', '{"format":"plumbline-state","version":1,"case":'));
  await page.reload();
  const notice = page.getByRole('alert').filter({ hasText: 'The check saved on this device could not be read' });
  await notice.waitFor();
  assert.match(await notice.textContent(), /Its record over time is shown with a blank check/);
  assert.doesNotMatch(await notice.textContent(), /demo case/);
  await until(async () => (await summary.textContent()).startsWith(samples), 'the same record on screen');
  assert.equal(await page.getByLabel('Body height', { exact: true }).inputValue(), '', 'a blank check');
  // Rendered and saved again, the record is still on the device.
  await (await radial(page)).getByLabel('Mean', { exact: true }).fill('70');
  await settled(page);
  await until(async () => (await page.evaluate(() => localStorage.getItem('plumbline.state')))?.includes('"70"'), 'the new check saved');
  assert.equal(await page.evaluate(() => localStorage.getItem('plumbline.record')), record);
  await page.reload();
  await until(async () => (await summary.textContent()).startsWith(samples), 'the record after a reload');
  assert.deepEqual(problems, [], 'no script errors');
  await context.close();
});

test('two windows see each other\'s saves and ask before one overwrites the other', async () => {
  const a = await open(env.chrome.browser, env.server.url);
  const b = { page: await a.context.newPage() };
  await b.page.goto(env.server.url);
  await ready(b.page);
  const saved = () => a.page.evaluate(() => JSON.parse(localStorage.getItem('plumbline.state'))?.form.sources[0].mean.text);
  await (await radial(a.page)).getByLabel('Mean', { exact: true }).fill('81');
  await until(async () => (await saved()) === '81', 'window A saved');
  // Window B is told at once, and what it types does not overwrite A's.
  const warning = b.page.getByRole('alert').filter({ hasText: 'Another window of Plumbline on this device has saved a different check' });
  await warning.waitFor();
  await b.page.screenshot({ path: screenshotPath('other-window') });
  await (await radial(b.page)).getByLabel('Mean', { exact: true }).fill('77');
  const held = () => b.page.evaluate(() => Object.keys(localStorage).filter((k) => k.endsWith('.held-back')));
  await until(async () => (await held()).length > 0, 'B keeps its check aside');
  assert.equal(await saved(), '81', "A's check is not overwritten");
  // B opens A's check: its own is set aside, with a way back.
  await warning.getByRole('button', { name: "Open the other window's check" }).click();
  await until(async () => (await (await radial(b.page)).getByLabel('Mean', { exact: true }).inputValue()) === '81', "A's check in B");
  const kept = b.page.getByRole('status').filter({ hasText: 'Opened the check the other window saved' });
  await kept.getByRole('button', { name: 'Bring back the previous check' }).waitFor();
  await until(async () => (await held()).length === 0, 'the held-back copy gone once B chose');
  assert.equal(JSON.parse(await b.page.evaluate(() => localStorage.getItem('plumbline.kept'))).form.sources[0].mean.text, '77', "B's check set aside on the device");
  // A types again, B is told again; B keeps its own this time and saves it.
  await (await radial(a.page)).getByLabel('Mean', { exact: true }).fill('82');
  await until(async () => (await saved()) === '82', 'window A saved again');
  await warning.waitFor();
  await warning.getByRole('button', { name: "Keep this window's check" }).click();
  await until(async () => (await saved()) === '81', "B's check saved over A's, as chosen");
  // Now A is told before it would write over B's.
  const warningA = a.page.getByRole('alert').filter({ hasText: 'Another window of Plumbline on this device has saved a different check' });
  await warningA.waitFor();
  assert.equal(await (await radial(a.page)).getByLabel('Mean', { exact: true }).inputValue(), '82', "A's check still on A's screen");
  assert.deepEqual(a.problems, [], 'no script errors');
  await a.context.close();
});

test('a new check starts blank with no results of the last one, and can be undone', async () => {
  const { page, context } = await open(env.chrome.browser, env.server.url);
  await (await radial(page)).getByLabel('Mean', { exact: true }).fill('83');
  const before = await until(async () => {
    const j = await caseJsonOf(page);
    return JSON.parse(j).arterial[0].mean === '83 mmHg' && j;
  }, 'the edited mean');
  await page.getByRole('button', { name: 'New check' }).click();
  const notice = page.getByRole('status').filter({ hasText: 'New check started' });
  await notice.waitFor();
  assert.equal(await page.getByLabel('Body height', { exact: true }).inputValue(), '');
  assert.equal(await (await radial(page)).getByLabel('Mean', { exact: true }).inputValue(), '');
  assert.equal(await page.locator('.verdict').count(), 0, 'no results of the last check');
  await page.getByText('No answer yet. To check, enter:').waitFor();
  // A calm first view: nothing untouched is called a mistake.
  assert.equal(await page.locator('.problems').count(), 0, 'no red problem list');
  assert.equal(await page.locator('.msg-error').count(), 0, 'no red message beside a box');
  await page.screenshot({ path: screenshotPath('new-check') });

  await notice.getByRole('button', { name: 'Undo new check' }).waitFor();
  // The way back survives a reload: the set-aside check is saved too.
  await page.reload();
  const kept = page.getByRole('status').filter({ hasText: 'The previous check is set aside' });
  await kept.getByRole('button', { name: 'Bring back the previous check' }).click();
  await ready(page);
  assert.equal(await caseJsonOf(page), before);
  assert.equal(await (await radial(page)).getByLabel('Mean', { exact: true }).inputValue(), '83');
  assert.equal(await page.evaluate(() => localStorage.getItem('plumbline.kept')), null, 'nothing left aside');
  await context.close();
});

test('the saved state is a versioned envelope of our own, and holds no record in it', async () => {
  const { page, context } = await open(env.chrome.browser, env.server.url);
  await (await radial(page)).getByLabel('Mean', { exact: true }).fill('77');
  const saved = await until(async () => {
    const text = await page.evaluate(() => localStorage.getItem('plumbline.state'));
    return text && JSON.parse(text).form.sources[0].mean.text === '77' && JSON.parse(text);
  }, 'the saved mean');
  assert.equal(saved.format, 'plumbline-state');
  assert.equal(saved.version, 1);
  assert.equal(saved.case.format, 'plumbline-case');
  assert.equal(saved.case.timeline, undefined);
  const keys = await page.evaluate(() => Object.keys(localStorage).sort());
  assert.deepEqual(keys, ['plumbline.state'], 'nothing else is kept for an untouched device');
  await context.close();
});
