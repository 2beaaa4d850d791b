// Share without a server: a link made on one device opens the same check
// on another; a damaged or hostile link shows its notice and runs nothing.
//
//   1. the share dialog's link opens the same check in a fresh browser
//   2. opening a link over a saved check keeps that check, with a way back
//   3. a link pasted into the open app's address bar opens too
//   4. malformed, truncated and hostile fragments: a notice, nothing runs,
//      the link kept for download as it came
//   5. screenshots of the dialog at tablet and phone sizes
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { deflateRawSync } from 'node:zlib';
import { readFileSync } from 'node:fs';
import { suite, open, until, caseJsonOf, screenshotPath, showSource, unfold } from './harness.mjs';

const env = suite();

const radial = (page) => showSource(page);

/** A fragment carrying `json` as a share link does (deflate, base64url). */
const fragmentOf = (json) => `p1.${deflateRawSync(Buffer.from(json)).toString('base64url')}`;

/** Opens the share dialog and reads its link. */
async function shareLink(page) {
  await page.getByRole('button', { name: /^Share/ }).click();
  const dialog = page.getByRole('dialog', { name: 'Share this check' });
  await dialog.waitFor();
  await dialog.getByRole('img', { name: 'QR code of the link' }).waitFor();
  return { dialog, link: await dialog.getByLabel('Link to this check').inputValue() };
}

test('a share link opens the same check in a fresh browser', async () => {
  const a = await open(env.chrome.browser, env.server.url);
  await (await radial(a.page)).getByLabel('Mean', { exact: true }).fill('86');
  await a.page.getByLabel('Posture').selectOption({ label: 'head-up (backrest raised)' });
  const json = await until(async () => {
    const j = await caseJsonOf(a.page);
    return JSON.parse(j).position.posture === 'head_up' && JSON.parse(j).arterial[0].mean === '86 mmHg' && j;
  }, 'the edited case');
  const { dialog, link } = await shareLink(a.page);
  assert.ok(link.startsWith(`${env.server.url}#p1.`), link);
  assert.ok(link.length < 1000, `${link.length} characters`);
  // The QR code is one path, dark on white.
  const qr = await dialog.locator('svg.qr path').getAttribute('d');
  assert.match(qr, /^(M\d+ \d+h\d+v1h-\d+z)+$/);
  await dialog.getByRole('button', { name: 'Copy link' }).click();
  await dialog.getByRole('status').filter({ hasText: /Copied|select the text/ }).waitFor();
  await dialog.getByRole('button', { name: 'Close' }).click();
  await until(async () => !(await dialog.isVisible()), 'the dialog to close');

  const b = await open(env.chrome.browser, env.server.url, { address: link });
  await b.page.getByRole('status').filter({ hasText: 'Opened the check from the shared link' }).waitFor();
  assert.equal(await caseJsonOf(b.page), json, 'the same case');
  assert.equal(await (await radial(b.page)).getByLabel('Mean', { exact: true }).inputValue(), '86');
  assert.equal(b.page.url(), env.server.url, 'the fragment is gone from the address bar');
  // A reload shows the check as saved, not the link again.
  await (await radial(b.page)).getByLabel('Mean', { exact: true }).fill('87');
  await b.page.reload();
  await b.page.getByRole('heading', { name: "At the organs' own height" }).waitFor();
  assert.equal(await (await radial(b.page)).getByLabel('Mean', { exact: true }).inputValue(), '87');
  assert.deepEqual([...a.foreign, ...b.foreign], [], 'no request leaves 127.0.0.1');
  assert.deepEqual([...a.problems, ...b.problems], [], 'no script errors');
  await a.context.close();
  await b.context.close();
});

test('a link over a saved check keeps that check, with a way back', async () => {
  const a = await open(env.chrome.browser, env.server.url);
  const { link } = await shareLink(a.page);
  await a.context.close();

  const { page, context } = await open(env.chrome.browser, env.server.url);
  await (await radial(page)).getByLabel('Mean', { exact: true }).fill('66');
  const mine = await until(async () => {
    const j = await caseJsonOf(page);
    return JSON.parse(j).arterial[0].mean === '66 mmHg' && j;
  }, 'my check');
  await page.goto(link);
  const notice = page.getByRole('status').filter({ hasText: 'The previous check is set aside' });
  await notice.waitFor();
  assert.equal(await (await radial(page)).getByLabel('Mean', { exact: true }).inputValue(), '74');
  await notice.getByRole('button', { name: 'Bring back the previous check' }).click();
  await until(async () => (await caseJsonOf(page)) === mine, 'my check back');
  await context.close();
});

test('a link pasted into the open app opens too', async () => {
  const a = await open(env.chrome.browser, env.server.url);
  await (await radial(a.page)).getByLabel('Mean', { exact: true }).fill('92');
  await until(async () => JSON.parse(await caseJsonOf(a.page)).arterial[0].mean === '92 mmHg', 'the edit');
  const { link } = await shareLink(a.page);
  await a.context.close();

  const { page, context } = await open(env.chrome.browser, env.server.url);
  await page.evaluate((hash) => { window.location.hash = hash; }, link.split('#')[1]);
  await until(async () => (await (await radial(page)).getByLabel('Mean', { exact: true }).inputValue()) === '92', 'the shared mean');
  await until(async () => !page.url().includes('#'), 'the fragment to leave the address bar');
  await context.close();
});

const hostile = '<img src=x onerror="window.__ran=1"><script>window.__ran=1</script>';
const demoJson = JSON.stringify({ format: 'plumbline-case', version: 1 });
const fragments = [
  ['markup and script text', `#${hostile}`],
  ['script text after the prefix', `#p1.${hostile}`],
  ['a truncated link', `#${fragmentOf(JSON.stringify({ format: 'plumbline-case', version: 1, patient: { height: '170 cm' } })).slice(0, 30)}`],
  ['a link of a newer version', '#p7.abc'],
  ['a link that is not base64', '#p1.!!!!'],
  ['JSON that is not a case', `#${fragmentOf('{"format": "plumbline-case", "version": 1, "arterial": [{"id": "' + hostile.replace(/"/g, "'") + '"}]}')}`],
  ['text that is not JSON', `#${fragmentOf('</script><script>window.__ran=1</script>')}`],
  ['an empty prefix', '#p1.'],
  ['a case of a newer version', `#${fragmentOf(demoJson.replace('"version":1', '"version":9'))}`],
];

for (const [what, fragment] of fragments) {
  test(`${what}: a notice, and nothing runs`, async () => {
    const { page, context, foreign, problems } = await open(env.chrome.browser, env.server.url, { address: env.server.url + fragment });
    const dialogs = [];
    page.on('dialog', (d) => { dialogs.push(d.message()); d.dismiss(); });
    const notice = page.getByRole('alert').filter({ hasText: 'The link could not be opened' });
    await notice.waitFor();
    assert.ok((await notice.textContent()).includes('the check on screen is unchanged'));
    await page.getByRole('note').filter({ hasText: 'Invented demo case' }).waitFor();
    assert.equal(await page.evaluate(() => window.__ran), undefined, 'no script ran');
    assert.equal(await page.locator('img[src="x"], body script').count(), 0, 'no markup from the link');
    assert.equal(page.url(), env.server.url, 'the fragment is gone');
    // The app still works.
    await (await radial(page)).getByLabel('Mean', { exact: true }).fill('80');
    await until(async () => JSON.parse(await caseJsonOf(page)).arterial[0].mean === '80 mmHg', 'an edit');
    // The link is kept for download, exactly as it came.
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      notice.getByRole('button', { name: 'Download the copy' }).click(),
    ]);
    assert.equal(readFileSync(await download.path(), 'utf8'), new URL(env.server.url + fragment).hash);
    await notice.getByRole('button', { name: 'Discard it' }).click();
    await until(async () => (await notice.count()) === 0, 'the notice gone');
    assert.deepEqual(dialogs, [], 'no dialog');
    assert.deepEqual(foreign, [], 'no request leaves 127.0.0.1');
    assert.deepEqual(problems, [], 'no script errors');
    await context.close();
  });
}

test('a valid case with markup in a label shows it as text only', async () => {
  const label = '<b onmouseover=alert(1)>x</b>';
  const json = JSON.stringify({
    format: 'plumbline-case', version: 1,
    patient: { height: '170 cm' },
    position: { posture: 'supine' },
    arterial: [{ id: label, method: 'transducer', level: 'heart', mean: '80 mmHg' }],
  });
  const { page, context } = await open(env.chrome.browser, env.server.url, { address: `${env.server.url}#${fragmentOf(json)}` });
  page.on('dialog', () => assert.fail('a dialog opened'));
  await page.getByRole('status').filter({ hasText: 'Opened the check from the shared link' }).waitFor();
  assert.equal(await (await showSource(page)).getByLabel('Short label (no names)').inputValue(), label);
  assert.equal(await page.locator('b[onmouseover]').count(), 0, 'no element made from the label');
  await context.close();
});

for (const [name, viewport] of [['share-tablet', { width: 768, height: 1024 }], ['share-phone', { width: 390, height: 844 }]]) {
  test(`screenshot ${name}: the dialog fits`, async () => {
    const { page, context } = await open(env.chrome.browser, env.server.url, { viewport });
    const { dialog } = await shareLink(page);
    const box = await dialog.boundingBox();
    assert.ok(box.x >= 0 && box.x + box.width <= viewport.width, 'the dialog fits the width');
    const qr = await dialog.locator('svg.qr').boundingBox();
    assert.ok(qr.width >= 240, `the QR code is ${qr.width}px wide`);
    await page.screenshot({ path: screenshotPath(name) });
    await context.close();
  });
}
