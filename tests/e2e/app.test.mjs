// Browser tests of the bedside screen against the release build in dist/:
// the numbers on screen are the core's (checked against the CLI on the
// page's own case document), entries behave, and the layout holds.
//
//   1. the demo check shows the core's numbers
//   2. a new position and a new reading change them as the core predicts
//   3. a unit switch converts the box and leaves the results alone
//   4. a bad entry keeps its text, shows its message, marks results stale
//   5. targets: change a threshold, add and remove one
//   6. the main flow with the keyboard only
//   7. screenshots at tablet and phone sizes and in the dark theme
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { suite, open, checkWithCli, rounded, screenshotPath, until, caseJsonOf, unfold } from './harness.mjs';

const env = suite();



/** Waits until the page's case differs from `before`, then returns it. */
const caseChange = (page, before) =>
  until(async () => {
    const now = await caseJsonOf(page);
    return now !== before && now;
  }, 'the case to change');

const organ = (page, label) => page.getByRole('region', { name: label, exact: true });

/**
 * Every organ, metric, value, status word and value to defend of the CLI's
 * report for the page's own case is on screen, and nothing else is.
 */
async function matchesCli(page) {
  const json = await caseJsonOf(page);
  const report = checkWithCli(json);
  assert.equal(
    await page.locator('section.organ').count(),
    report.organs.length,
    'one section per checked organ',
  );
  for (const o of report.organs) {
    const section = organ(page, o.label);
    for (const m of o.metrics) {
      const group = section.getByRole('group', { name: m.label, exact: true });
      assert.equal(await group.locator('.value').textContent(), rounded(m.value_mmhg), `${o.label} ${m.label}`);
      const range = await group.locator('.range').first().textContent();
      assert.equal(range, `range ${rounded(m.lower_mmhg)} to ${rounded(m.upper_mmhg)} mmHg`);
      for (const t of m.targets) {
        const text = await group.textContent();
        assert.ok(text.includes(`${t.target}: ${t.words}`), `${o.label}: "${t.target}: ${t.words}"`);
        const word = { met: 'MET', below: 'BELOW', above: 'ABOVE' }[t.status] ?? 'NOT EVALUATED';
        assert.ok(text.includes(word), `${o.label} ${t.target} ${word}`);
        for (const r of t.defend) assert.ok(text.includes(`To meet it now: ${r.words}`), r.words);
      }
    }
  }
  const notChecked = page.getByText(`Not checked (${report.not_checked.length}): what each needs`);
  if (report.not_checked.length > 0) await notChecked.waitFor();
  return report;
}

test('the demo check shows the core\'s numbers', async () => {
  const { page, context, foreign, problems } = await open(env.chrome.browser, env.server.url);
  const report = await matchesCli(page);
  const brain = report.organs.find((o) => o.organ === 'brain');
  const cpp = brain.metrics.find((m) => m.metric === 'perfusion');
  // The answer pinned at the top is the core's summary, line by line.
  const summary = page.getByRole('region', { name: "At the organs' own height" });
  const answer = await summary.textContent();
  assert.ok(answer.includes(report.summary.headline), answer);
  for (const line of report.summary.organs) {
    assert.ok(answer.includes(line.label) && (!line.value || answer.includes(line.value)), line.label);
    if (line.defend) assert.ok(answer.includes(`Defend ${line.defend}`), line.defend);
  }
  assert.ok(answer.includes(`CPP ${rounded(cpp.value_mmhg)} mmHg`));
  assert.ok(answer.includes('DEMO'), 'the answer says it is the demo');
  await page.getByText(report.caution).waitFor({ state: 'attached' });
  await page.getByRole('note').filter({ hasText: 'Invented demo case' }).waitFor();
  // The assumed ICP is marked where it is entered and where it is used.
  await unfold(page, 'Other pressures');
  await page.getByRole('group', { name: /ASSUMED ICP/ }).waitFor();
  assert.ok((await organ(page, 'Brain').textContent()).includes('uses an assumed ICP'));
  assert.deepEqual(foreign, [], 'no request leaves 127.0.0.1');
  assert.deepEqual(problems, [], 'no script errors');
  await context.close();
});

test('a new position and a new reading change the results as the core predicts', async () => {
  const { page, context } = await open(env.chrome.browser, env.server.url);
  const first = await caseJsonOf(page);
  const cppBefore = await organ(page, 'Brain').getByRole('group', { name: 'CPP', exact: true }).locator('.value').textContent();

  await page.getByLabel('Posture').selectOption({ label: 'head-up (backrest raised)' });
  const second = await caseChange(page, first);
  assert.equal(JSON.parse(second).position.posture, 'head_up');
  const report = await matchesCli(page);
  const cpp = report.organs.find((o) => o.organ === 'brain').metrics.find((m) => m.metric === 'perfusion');
  assert.notEqual(rounded(cpp.value_mmhg), cppBefore, 'a lower head raises CPP at the tragus');

  await unfold(page, 'Arterial sources');
  const radial = page.getByRole('group', { name: /Arterial source 1/ });
  await radial.getByText(/separate boxes/).click();
  await radial.getByLabel('Mean', { exact: true }).fill('88');
  const third = await caseChange(page, second);
  assert.equal(JSON.parse(third).arterial[0].mean, '88 mmHg');
  await matchesCli(page);
  assert.equal(await page.getByText('These numbers belong to no patient').count(), 0, 'no untouched-demo notice on a changed case');
  await page.getByRole('note').filter({ hasText: 'Still from the invented demo case' }).waitFor();

  await unfold(page, 'Other pressures');
  await page.getByLabel('Pressure to add').selectOption({ label: 'ICP' });
  await page.getByRole('button', { name: 'Add measured' }).click();
  await page.getByRole('group', { name: 'ICP (measured)' }).getByLabel('ICP', { exact: true }).fill('18');
  const fourth = await caseChange(page, third);
  assert.equal(JSON.parse(fourth).readings.icp.value, '18 mmHg');
  const withIcp = await matchesCli(page);
  const brain = withIcp.organs.find((o) => o.organ === 'brain').metrics.find((m) => m.metric === 'perfusion');
  assert.deepEqual(brain.assumed, [], 'a measured ICP replaces the assumed one');

  // The demo button asks first: refused, nothing changes; accepted, the demo returns.
  page.once('dialog', (d) => d.dismiss());
  await page.getByRole('button', { name: 'Reload the demo case' }).click();
  assert.equal(await caseJsonOf(page), fourth);
  page.once('dialog', (d) => d.accept());
  await page.getByRole('button', { name: 'Reload the demo case' }).click();
  await until(async () => (await caseJsonOf(page)) === first, 'the demo case back');
  await context.close();
});

test('a run of keystrokes is checked once typing pauses, not at every key, and the answer says it is updating meanwhile', async () => {
  const { page, context, problems } = await open(env.chrome.browser, env.server.url);
  const pin = page.locator('.answer-pin');
  const cpp = organ(page, 'Brain').getByRole('group', { name: 'CPP', exact: true }).locator('.value');
  const before = await cpp.textContent();
  const box = page.locator('.quick').getByLabel('Blood pressure', { exact: true });
  await box.fill('');
  await page.locator('.answer-pin[aria-busy="false"]').waitFor();
  // Counts the answer's updates: each is marked busy, then checked.
  await pin.evaluate((el) => {
    window.__checks = 0;
    let busy = false;
    new MutationObserver(() => {
      const now = el.getAttribute('aria-busy') === 'true';
      if (busy && !now) window.__checks += 1;
      busy = now;
    }).observe(el, { attributes: true, attributeFilter: ['aria-busy'] });
  });
  const keys = '100/60 (80)';
  await box.pressSequentially(keys);
  await until(async () => (await page.evaluate(() => window.__checks)) > 0, 'the check after the pause');
  await page.locator('.answer-pin[aria-busy="false"]').waitFor();
  assert.equal(await box.inputValue(), keys, 'every key in the box');
  const checks = await page.evaluate(() => window.__checks);
  assert.ok(checks < keys.length, `${checks} checks for ${keys.length} keys`);
  assert.notEqual(await cpp.textContent(), before);
  await matchesCli(page);
  assert.deepEqual(problems, [], 'no script errors');
  await context.close();
});

test('a unit switch converts the box and leaves the results unchanged', async () => {
  const { page, context } = await open(env.chrome.browser, env.server.url);
  const before = await matchesCli(page);
  await unfold(page, 'Arterial sources');
  const radial = page.getByRole('group', { name: /Arterial source 1/ });
  await radial.getByText(/separate boxes/).click();
  const mean = radial.getByLabel('Mean', { exact: true });
  await radial.getByLabel('Mean unit').selectOption('kPa');
  await until(async () => (await mean.inputValue()) === '9.87', 'the mean in kPa');
  const json = await caseJsonOf(page);
  assert.match(JSON.parse(json).arterial[0].mean, / kPa$/);
  const after = await matchesCli(page);
  const values = (r) => r.organs.flatMap((o) => o.metrics.map((m) => rounded(m.value_mmhg)));
  assert.deepEqual(values(after), values(before));
  // The reading to defend is now given in the source's own unit.
  assert.ok((await organ(page, 'Brain').textContent()).includes('radial line: mean at least 12.7 kPa'));

  await radial.getByLabel('Mean unit').selectOption('cmH2O');
  await until(async () => (await mean.inputValue()) === '100.6', 'the mean in cmH2O');
  await radial.getByLabel('Mean unit').selectOption('mmHg');
  await until(async () => (await mean.inputValue()) === '74', 'the typed mean back');

  const height = page.getByLabel('Body height', { exact: true });
  await page.getByLabel('Body height unit').selectOption('in');
  await until(async () => (await height.inputValue()) === '67.7', 'the height in inches');
  assert.deepEqual(values(await matchesCli(page)), values(before));
  await context.close();
});

test('a bad entry keeps its text, shows its message beside it and marks results stale', async () => {
  const { page, context } = await open(env.chrome.browser, env.server.url);
  const cpp = organ(page, 'Brain').getByRole('group', { name: 'CPP', exact: true }).locator('.value');
  const good = await cpp.textContent();
  await unfold(page, 'Arterial sources');
  const radial = page.getByRole('group', { name: /Arterial source 1/ });
  await radial.getByText(/separate boxes/).click();
  const systolic = radial.getByLabel('Systolic', { exact: true });
  await systolic.fill('1o4');
  const message = page.locator('#f-arterial-0-systolic-msg');
  await message.waitFor();
  // The text as typed, with no unit added to it.
  assert.ok((await message.textContent()).includes("'1o4' is not a number"), await message.textContent());
  assert.equal(await systolic.inputValue(), '1o4');
  assert.equal(await systolic.getAttribute('aria-invalid'), 'true');
  assert.equal(await systolic.getAttribute('aria-describedby'), 'f-arterial-0-systolic-msg');
  await page.getByRole('heading', { name: 'Not checked: 1 entry needs attention' }).waitFor();
  await page.getByText('The results are STALE').waitFor();
  assert.equal(await cpp.textContent(), good, 'the last good result stays');
  const live = page.locator('[aria-live="polite"]');
  assert.match(await live.textContent(), /^Not checked: 1 entry needs attention\. The results shown are from the last good check\.$/);

  // The picture is of the last good check too, and says so.
  await page.getByLabel('Posture').selectOption({ label: 'prone' });
  await page.getByText('STALE: the position of the last good check').waitFor();

  // A value the core refuses (out of range) gets the core's own message.
  await systolic.fill('1040');
  await until(async () => (await message.textContent()).includes('outside the accepted range'), 'the range message');
  assert.equal(await systolic.inputValue(), '1040');

  await systolic.fill('104');
  await until(async () => (await page.locator('.problems').count()) === 0, 'the problems to clear');
  assert.equal(await live.textContent(), checkWithCli(await caseJsonOf(page)).summary.headline);
  assert.equal(JSON.parse(await caseJsonOf(page)).position.posture, 'prone');
  await matchesCli(page);
  await context.close();
});

test('targets can be changed, added and removed, each with its source', async () => {
  const { page, context } = await open(env.chrome.browser, env.server.url);
  await unfold(page, 'Targets');
  await page.getByText(/Change, add or remove targets/).click();
  const first = page.getByRole('group', { name: 'Target 1: Brain: CPP' });
  assert.ok((await first.getByLabel('Source').inputValue()).includes('Brain Trauma Foundation'));
  const before = await caseJsonOf(page);
  await first.getByLabel('Threshold', { exact: true }).fill('70');
  const changed = await caseChange(page, before);
  assert.equal(JSON.parse(changed).targets[0].at_least, '70 mmHg');
  await matchesCli(page);
  assert.ok((await organ(page, 'Brain').textContent()).includes('CPP at least 70 mmHg: BELOW'));

  const count = JSON.parse(changed).targets.length;
  await page.getByLabel('Target to add').selectOption({ label: 'Brain: MAP at brain level' });
  await page.getByRole('button', { name: 'Add target' }).click();
  const added = page.getByRole('group', { name: `Target ${count + 1}: Brain: MAP at brain level` });
  await added.getByLabel('Threshold', { exact: true }).fill('55');
  await added.getByLabel('Source').fill('unit protocol');
  const withNew = await until(async () => {
    const j = JSON.parse(await caseJsonOf(page));
    return j.targets.length === count + 1 && j.targets[count].source === 'unit protocol' && j;
  }, 'the new target');
  assert.equal(withNew.targets[count].at_least, '55 mmHg');
  await matchesCli(page);
  assert.ok((await organ(page, 'Brain').textContent()).includes('Target source: unit protocol'));

  await page.getByRole('button', { name: `Remove target ${count + 1}` }).click();
  await until(async () => JSON.parse(await caseJsonOf(page)).targets.length === count, 'the removal');
  await page.getByRole('button', { name: 'Restore default targets' }).click();
  await until(async () => JSON.parse(await caseJsonOf(page)).targets === undefined, 'the defaults');
  await context.close();
});

test('the main flow works with the keyboard alone', async () => {
  const { page, context } = await open(env.chrome.browser, env.server.url);
  const focused = () => page.evaluate(() => document.activeElement?.id || document.activeElement?.textContent);
  await page.keyboard.press('Tab');
  assert.equal(await focused(), 'Skip to the answer');

  const tabTo = async (id, limit = 60) => {
    for (let i = 0; i < limit; i += 1) {
      if ((await focused()) === id) return;
      await page.keyboard.press('Tab');
    }
    throw new Error(`Tab never reached ${id}`);
  };
  await tabTo('f-position-posture');
  const before = await caseJsonOf(page);
  await page.keyboard.press('ArrowDown');
  const moved = await caseChange(page, before);
  assert.equal(JSON.parse(moved).position.posture, 'sitting');

  await tabTo('f-position-backrest_deg');
  await page.keyboard.press('Control+A');
  await page.keyboard.type('40');
  // The steppers are the arrow keys, not tab stops: Tab goes on to the level.
  await page.keyboard.press('ArrowUp');
  await page.keyboard.press('Tab');
  assert.equal(await focused(), 'Measure with this device');
  const stepped = await until(async () => {
    const j = JSON.parse(await caseJsonOf(page));
    return j.position.backrest_deg === 45 && j;
  }, 'backrest 45 after +5');
  assert.equal(stepped.position.posture, 'sitting');
  await matchesCli(page);

  // Open a result's derivation from the keyboard.
  const summary = page.getByText(/^How CPP = \d+ mmHg was found$/);
  await summary.focus();
  await page.keyboard.press('Enter');
  await until(() => summary.evaluate((s) => s.parentElement.open), 'the derivation to open');
  assert.ok((await organ(page, 'Brain').textContent()).includes('CPP ='));
  await context.close();
});

const sizes = [
  ['tablet-portrait', { width: 768, height: 1024 }, 'light'],
  ['tablet-landscape', { width: 1024, height: 768 }, 'light'],
  ['phone', { width: 390, height: 844 }, 'light'],
  ['dark', { width: 1024, height: 768 }, 'dark'],
];

for (const [name, viewport, colorScheme] of sizes) {
  test(`screenshot ${name}: nothing overflows, controls are large and labelled, the caution shows`, async () => {
    const { page, context } = await open(env.chrome.browser, env.server.url, { viewport, colorScheme });
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    assert.ok(overflow <= 0, `page wider than the screen by ${overflow}px`);
    const caution = await page.getByRole('complementary', { name: 'Caution' }).boundingBox();
    assert.ok(caution && caution.y + caution.height <= viewport.height + 1, 'caution on screen');
    const small = await page.evaluate(() =>
      [...document.querySelectorAll('button, select, input, summary')]
        .filter((e) => e.offsetParent !== null)
        .map((e) => [e.id || e.textContent.trim().slice(0, 30), e.getBoundingClientRect().height])
        .filter(([, h]) => h < 44));
    assert.deepEqual(small, [], 'every control at least 44 px tall');
    const unlabelled = await page.evaluate(() =>
      [...document.querySelectorAll('input, select, textarea')]
        .filter((e) => !e.getAttribute('aria-label') && !document.querySelector(`label[for="${e.id}"]`))
        .map((e) => e.id || e.outerHTML.slice(0, 60)));
    assert.deepEqual(unlabelled, [], 'every box has a label');
    const ids = await page.evaluate(() => [...document.querySelectorAll('[id]')].map((e) => e.id));
    assert.deepEqual(ids.filter((id, i) => ids.indexOf(id) !== i), [], 'ids are unique');
    await page.screenshot({ path: screenshotPath(name) });
    await page.screenshot({ path: screenshotPath(`${name}-full`), fullPage: true });
    await context.close();
  });
}

test('the theme toggle gives the dark theme, remembers it, and prints one light page', async () => {
  const { page, context } = await open(env.chrome.browser, env.server.url, { colorScheme: 'light' });
  await page.getByRole('button', { name: /^Theme: device/ }).click();
  await until(async () => (await page.evaluate(() => document.documentElement.dataset.theme)) === 'dark', 'dark');
  await page.screenshot({ path: screenshotPath('dark-toggle') });
  await page.reload();
  await page.getByRole('heading', { name: "At the organs' own height" }).waitFor();
  assert.equal(await page.evaluate(() => document.documentElement.dataset.theme), 'dark');
  await page.emulateMedia({ media: 'print' });
  await page.screenshot({ path: screenshotPath('print'), fullPage: true });
  const pdf = (await page.pdf({ format: 'A4', printBackground: true })).toString('latin1');
  const pages = (pdf.match(/\/Type\s*\/Page[^s]/g) ?? []).length;
  assert.equal(pages, 1, 'the handover prints on one A4 page');
  await context.close();
});
