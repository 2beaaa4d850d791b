// Nothing lost: the check as typed and the theme survive a reload; a saved
// state that cannot be read is offered for download and the app still
// works; a new check can be undone.
//
//   1. a reload brings back every box as typed, mistakes and units included
//   2. an unreadable saved state: notice, raw copy downloaded, app works
//   3. a new check starts blank, with no results of the last one; undo
//   4. the stored envelope is our own, versioned, and lean
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { suite, open, until, caseJsonOf, screenshotPath, showSource, unfold } from './harness.mjs';

const env = suite();

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
    notice.getByRole('button', { name: 'Download the unreadable copy' }).click(),
  ]);
  assert.equal(download.suggestedFilename(), 'plumbline-unreadable-save.txt');
  assert.equal(readFileSync(await download.path(), 'utf8'), broken, 'the raw copy, byte for byte');

  // The app works, and saves again.
  await (await radial(page)).getByLabel('Mean', { exact: true }).fill('79');
  await until(async () => JSON.parse(await caseJsonOf(page)).arterial[0].mean === '79 mmHg', 'the new mean');
  // The raw copy outlives a reload until it is discarded.
  await page.reload();
  await ready(page);
  assert.equal(await (await radial(page)).getByLabel('Mean', { exact: true }).inputValue(), '79');
  await notice.waitFor();
  await notice.getByRole('button', { name: 'Discard it' }).click();
  await until(async () => (await page.evaluate(() => localStorage.getItem('plumbline.unreadable'))) === null, 'the copy gone');
  await page.reload();
  await ready(page);
  assert.equal(await page.getByText('could not be read').count(), 0);
  assert.deepEqual(problems, [], 'no script errors');
  await context.close();
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
