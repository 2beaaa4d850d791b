// Bedside first: the usual jobs in at most five actions from "New check",
// the answer in view after every action on a phone, nothing invented judged
// once the demo is left, a ward record kept on a phone without scrolling,
// and the device as a level.
//
//   1. three quick paths (beach-chair cuff; head-up 30° with a line and a
//      drain; prone with a line): the actions counted and held to five, the
//      pinned answer in view after each, the answer the core's, the phone
//      page height of the quick path reported; screenshots at phone and
//      tablet sizes, light and dark
//   2. leaving the demo lists every invented value; one tap clears them
//   3. five cuff readings on a phone, no scrolling between them; the answer
//      counts the record; readings corrected and removed; the link carries it
//   4. the device as a level under the DevTools orientation override, and
//      the clean fallback without a sensor
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { suite, open, until, caseJsonOf, checkWithCli, screenshotPath } from './harness.mjs';

const env = suite();

const PHONE = { width: 390, height: 844 };
const MOST_ACTIONS = 5;

/**
 * Counts the clinician's actions (a choice, a box filled, a tap) and checks
 * after each that the pinned answer is in view and not cut off.
 */
function actions(page, viewport) {
  let n = 0;
  return {
    count: () => n,
    async act(what, fn) {
      await fn();
      n += 1;
      const box = await page.locator('.answer-pin').boundingBox();
      assert.ok(box && box.y >= -1 && box.y + Math.min(box.height, 60) <= viewport.height,
        `the answer is in view after "${what}" (${JSON.stringify(box)})`);
    },
  };
}

/** The quick path's part of the page. */
const quick = (page) => page.locator('.quick');

/** The answer shown is the core's summary for the page's own case. */
async function answerIsTheCores(page) {
  const report = checkWithCli(await caseJsonOf(page));
  const text = await page.locator('.answer-pin').textContent();
  assert.ok(text.includes(report.summary.headline), `${report.summary.headline} in ${text}`);
  for (const line of report.summary.organs) {
    if (line.value) assert.ok(text.includes(line.value), line.value);
    if (line.defend) assert.ok(text.includes(`Defend ${line.defend}`), line.defend);
  }
  return report;
}

const jobs = [
  {
    name: 'beach-chair cuff',
    shot: 'beach-chair',
    steps: [
      ['posture', (p) => quick(p).getByLabel('Posture').selectOption({ label: 'beach chair' })],
      ['body height', (p) => quick(p).getByLabel('Body height', { exact: true }).fill('170')],
      ['site', (p) => quick(p).getByLabel('Taken with').selectOption({ label: 'L arm cuff' })],
      ['blood pressure', (p) => quick(p).getByLabel('Blood pressure', { exact: true }).fill('100/60')],
      ['organ of concern', (p) => quick(p).getByRole('button', { name: 'Brain', exact: true }).click()],
    ],
    check(report, json) {
      assert.equal(json.position.posture, 'beach_chair');
      assert.equal(json.arterial[0].id, 'L arm cuff');
      assert.equal(json.arterial[0].level, 'upper_arm_left');
      assert.deepEqual(report.summary.organs.map((o) => o.organ), ['brain']);
      assert.notEqual(report.summary.organs[0].status, 'not_evaluated', 'the brain is judged with a cuff alone');
    },
  },
  {
    name: 'head-up 30° with a line and a drain',
    shot: 'head-up',
    steps: [
      ['posture', (p) => quick(p).getByLabel('Posture').selectOption({ label: 'head-up (backrest raised)' })],
      ['body height', (p) => quick(p).getByLabel('Body height', { exact: true }).fill('175')],
      ['blood pressure', (p) => quick(p).getByLabel('Blood pressure', { exact: true }).fill('120/70 (85)')],
      ['ICP', (p) => quick(p).getByLabel('ICP', { exact: true }).fill('15')],
      ['organ of concern', (p) => quick(p).getByRole('button', { name: 'Brain', exact: true }).click()],
    ],
    check(report, json) {
      assert.equal(json.position.backrest_deg, undefined, "the posture's usual 30°");
      assert.ok(report.warnings.some((w) => w.field === 'position.backrest_deg' && /usual 30° is ASSUMED/.test(w.message)),
        'the usual angle is said to be assumed');
      assert.equal(json.arterial[0].method, 'transducer');
      assert.equal(json.readings.icp.value, '15 mmHg');
      assert.ok(report.summary.organs[0].value.startsWith('CPP'), 'with an ICP, CPP decides');
    },
  },
  {
    name: 'prone with a line',
    shot: 'prone',
    steps: [
      ['posture', (p) => quick(p).getByLabel('Posture').selectOption({ label: 'prone' })],
      ['body height', (p) => quick(p).getByLabel('Body height', { exact: true }).fill('180')],
      ['blood pressure', (p) => quick(p).getByLabel('Blood pressure', { exact: true }).fill('110/65 (80)')],
      ['organ of concern', (p) => quick(p).getByRole('button', { name: 'Spinal cord', exact: true }).click()],
    ],
    check(report, json) {
      assert.equal(json.position.posture, 'prone');
      assert.deepEqual(json.concern, ['cord']);
      assert.deepEqual(report.summary.organs.map((o) => o.organ), ['cord']);
    },
  },
];

for (const job of jobs) {
  test(`quick path, ${job.name}: at most ${MOST_ACTIONS} actions from New check, the answer in view throughout`, async (t) => {
    const { page, context, problems } = await open(env.chrome.browser, env.server.url, { viewport: PHONE });
    await page.getByRole('button', { name: 'New check' }).click();
    await page.getByText('No answer yet. To check, enter:').waitFor();
    // A calm first view: nothing is called a mistake before it is typed.
    assert.equal(await page.locator('.problems, .msg-error').count(), 0);
    const counted = actions(page, PHONE);
    // The body height is optional: without it the core assumes a population
    // height, flagged, with a wider range. Counted without it, then with it.
    for (const [what, step] of job.steps.filter(([w]) => w !== 'body height')) {
      await counted.act(what, () => step(page));
    }
    const withoutHeight = counted.count();
    await until(async () => (await page.locator('.verdict').count()) > 0, 'an answer without the height');
    await answerIsTheCores(page);
    for (const [what, step] of job.steps.filter(([w]) => w === 'body height')) {
      await counted.act(what, () => step(page));
    }
    assert.ok(counted.count() <= MOST_ACTIONS, `${counted.count()} actions`);
    await until(async () => JSON.parse(await caseJsonOf(page)).patient?.height, 'the height in the case');
    const json = JSON.parse(await caseJsonOf(page));
    const report = await answerIsTheCores(page);
    job.check(report, json);
    await page.evaluate(() => window.scrollTo(0, 0));
    const height = await page.evaluate(() => {
      const quick = document.querySelector('.quick').getBoundingClientRect();
      return Math.round(quick.bottom + window.scrollY);
    });
    t.diagnostic(`${job.name}: ${withoutHeight} actions without the body height, ${counted.count()} with it; `
      + `the quick path ends ${height} px down a `
      + `${PHONE.width}×${PHONE.height} phone page (${(height / PHONE.height).toFixed(2)} screens)`);
    assert.ok(height <= 2 * PHONE.height, `the quick path fits two phone screens (${height} px)`);
    await page.screenshot({ path: screenshotPath(`quick-${job.shot}-phone`) });
    for (const [size, viewport, scheme] of [
      ['phone-dark', PHONE, 'dark'],
      ['tablet-portrait', { width: 768, height: 1024 }, 'light'],
      ['tablet-landscape', { width: 1024, height: 768 }, 'light'],
      ['tablet-landscape-dark', { width: 1024, height: 768 }, 'dark'],
    ]) {
      await page.setViewportSize(viewport);
      await page.emulateMedia({ colorScheme: scheme });
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
      assert.ok(overflow <= 0, `${size}: wider than the screen by ${overflow}px`);
      await page.screenshot({ path: screenshotPath(`quick-${job.shot}-${size}`) });
    }
    assert.deepEqual(problems, [], 'no script errors');
    await context.close();
  });
}

test('leaving the demo lists its invented values, and one tap clears them all', async () => {
  const { page, context } = await open(env.chrome.browser, env.server.url, { viewport: PHONE });
  await page.getByRole('note').filter({ hasText: 'Invented demo case' }).waitFor();
  await quick(page).getByLabel('Blood pressure', { exact: true }).fill('100/60');
  const note = page.getByRole('note').filter({ hasText: 'Still from the invented demo case' });
  await note.waitFor();
  const listed = await note.textContent();
  for (const part of ['body height 172 cm', 'haematocrit 38%', 'beach chair, backrest 65°',
    'left arm cuff systolic 114 mmHg', 'assumed ICP 10 mmHg', 'baseline 136/80']) {
    assert.ok(listed.includes(part), `${part} in ${listed}`);
  }
  assert.ok(!listed.includes('radial line systolic'), 'what was typed is not listed');
  assert.ok((await page.locator('.answer-pin').textContent()).includes('DEMO'), 'the answer says so');
  await note.getByRole('button', { name: "Clear the demo's values, keep mine" }).click();
  await until(async () => (await page.getByRole('note').count()) === 0, 'no demo note');
  await quick(page).getByLabel('Body height', { exact: true }).fill('168');
  await until(async () => (await page.locator('.verdict').count()) > 0, 'the answer');
  const json = JSON.parse(await caseJsonOf(page));
  assert.equal(json.assume, undefined, 'no assumed ICP');
  assert.equal(json.baseline, undefined, 'no invented baseline');
  assert.equal(json.patient.haematocrit_percent, undefined);
  assert.equal(json.patient.height, '168 cm');
  assert.equal(json.position.posture, 'supine', 'the untouched position is not the demo\'s');
  assert.deepEqual(json.arterial.map((a) => [a.systolic, a.diastolic, a.mean]), [['100 mmHg', '60 mmHg', undefined]]);
  assert.ok(!(await page.locator('.answer-pin').textContent()).includes('DEMO'));
  await answerIsTheCores(page);
  await context.close();
});

test('a ward record of five cuff readings on a phone: no scrolling between them', async (t) => {
  const { page, context, problems } = await open(env.chrome.browser, env.server.url, { viewport: PHONE });
  await page.getByRole('button', { name: 'New check' }).click();
  await page.getByLabel('Posture').selectOption({ label: 'head-up (backrest raised)' });
  await page.getByLabel('Body height', { exact: true }).fill('170');
  await page.getByLabel('Taken with').selectOption({ label: 'L arm cuff' });
  await page.getByRole('button', { name: 'Whole body', exact: true }).click();
  await page.getByRole('link', { name: 'Record' }).click();
  const row = page.getByRole('form', { name: 'Add a blood pressure to the record' });
  const time = row.getByLabel('Time');
  const bp = row.getByLabel(/^Blood pressure/);
  const add = row.getByRole('button', { name: 'Add' });
  await bp.waitFor();
  const readings = [['08:00', '118/70'], ['08:05', '96/54'], ['08:10', '84/46'], ['08:15', '90/52'], ['08:20', '112/68']];
  // One tap on "Record" brings the row into view, under the answer; from
  // then on it stays where it is while the readings go in (the browser
  // keeps it in place as the answer above it grows).
  const inView = async (when) => {
    const pin = await page.locator('.answer-pin').boundingBox();
    const boxes = [await time.boundingBox(), await bp.boundingBox(), await add.boundingBox()];
    for (const box of boxes) {
      assert.ok(box.y >= pin.y + pin.height - 1 && box.y + box.height <= PHONE.height - 40,
        `the row in view, under the answer, ${when}: ${JSON.stringify(box)} under ${JSON.stringify(pin)}`);
    }
    return Math.round(boxes[1].y);
  };
  const first = await inView('after the tap on Record');
  for (const [i, [at, value]] of readings.entries()) {
    await time.fill(at);
    await bp.fill(value);
    await add.click();
    await until(async () => (await bp.inputValue()) === '', `reading ${i + 1} added`);
    const y = await inView(`after reading ${i + 1}`);
    assert.ok(Math.abs(y - first) <= 2, `the row stays put: ${y} px, was ${first} px`);
  }
  const scrolled = first;
  const list = page.getByRole('region', { name: 'Readings of L arm cuff' });
  assert.equal(await list.getByRole('row').count(), 1 + readings.length);
  const map = page.getByRole('region', { name: 'Whole body · MAP at the heart' });
  assert.equal(await map.locator('circle.reading-mark').count(), readings.length, 'every reading marked, the last too');
  // The answer counts the record's exposure, from the core's statuses.
  const pin = await page.locator('.answer-pin').textContent();
  assert.match(pin, /Over the record, MAP at the heart at least 65 mmHg: below for [\d.]+ min of 20\.0 min observed/);
  // The headline itself says it, whatever the last reading: the core's words.
  const headline = await page.locator('.answer-pin .headline').textContent();
  assert.match(headline, /Over the record, a target missed: Whole body for [\d.]+ min of 20\.0 min\./);
  // The latest reading is the one on screen.
  assert.equal(await quick(page).getByLabel('Blood pressure', { exact: true }).inputValue(), '112/68');
  await page.screenshot({ path: screenshotPath('ward-record-phone') });
  t.diagnostic(`ward record: ${readings.length} readings; the row stayed ${scrolled} px down the screen throughout`);

  // A reading with the device's mean does not mix into a record without
  // it: it is refused with what to type, and nothing changes.
  await time.fill('08:25');
  await bp.fill('100/60 (74)');
  await add.click();
  await row.getByText(/estimates each mean from systolic and diastolic/).waitFor();
  assert.equal(await list.getByRole('row').count(), 1 + readings.length);
  // A reading corrected and one taken out, from the list.
  await list.getByLabel(/^Reading at 08:10/).fill('88/50');
  await list.getByLabel(/^Reading at 08:10/).press('Tab');
  await until(async () => (await list.getByLabel(/^Reading at 08:10/).inputValue()) === '88/50', 'the corrected reading');
  await list.getByRole('button', { name: /^Remove the reading at 08:00/ }).click();
  await until(async () => (await list.getByRole('row').count()) === readings.length, 'one reading out');
  assert.equal(await list.getByLabel(/^Reading at 08:10/).inputValue(), '88/50');

  // The print carries the readings, as text, and the chart.
  await page.emulateMedia({ media: 'print' });
  assert.ok(await list.isVisible() && await list.locator('.print-only').first().isVisible(), 'the readings print');
  assert.ok(await map.getByRole('img').isVisible(), 'the chart prints');
  await page.emulateMedia({ media: 'screen' });

  // The shared link carries the record.
  await page.getByRole('button', { name: /^Share/ }).click();
  const dialog = page.getByRole('dialog', { name: 'Share this check' });
  await dialog.getByText('and the record over time').waitFor();
  const link = await dialog.getByLabel('Link to this check').inputValue();
  const other = await open(env.chrome.browser, env.server.url, { viewport: PHONE, address: link });
  const otherList = other.page.getByRole('region', { name: 'Readings of L arm cuff' });
  await until(async () => (await otherList.getByRole('row').count()) === readings.length, 'the record in the link');
  await other.context.close();
  assert.deepEqual(problems, [], 'no script errors');
  await context.close();
});

test('the device as a level fills the backrest, measured; without a sensor it says so', async () => {
  const { page, context } = await open(env.chrome.browser, env.server.url, { viewport: PHONE });
  await page.getByRole('button', { name: 'New check' }).click();
  await quick(page).getByLabel('Posture').selectOption({ label: 'head-up (backrest raised)' });
  await quick(page).getByLabel('Body height', { exact: true }).fill('170');
  await quick(page).getByLabel('Blood pressure', { exact: true }).fill('120/70');
  const cdp = await context.newCDPSession(page);
  await cdp.send('DeviceOrientation.setDeviceOrientationOverride', { alpha: 0, beta: 38.4, gamma: 0 });
  await page.getByRole('button', { name: 'Measure with this device' }).click();
  const use = page.getByRole('button', { name: 'Use 38°' });
  await use.waitFor();
  // Live: the reading follows the device.
  await cdp.send('DeviceOrientation.setDeviceOrientationOverride', { alpha: 0, beta: 41.2, gamma: 3 });
  await page.getByRole('button', { name: 'Use 41°' }).click();
  const backrest = page.getByLabel('Backrest', { exact: true });
  await until(async () => (await backrest.inputValue()) === '41', 'the measured angle in the box');
  await page.getByText('Measured with the device').waitFor();
  await until(async () => JSON.parse(await caseJsonOf(page)).position.backrest_measured === true, 'measured in the case');
  // Typing over it makes it an estimate again.
  await backrest.fill('40');
  await until(async () => JSON.parse(await caseJsonOf(page)).position.backrest_measured === undefined, 'an estimate again');
  await cdp.send('DeviceOrientation.clearDeviceOrientationOverride');
  await context.close();

  const plain = await open(env.chrome.browser, env.server.url, { viewport: PHONE });
  await plain.page.getByRole('button', { name: 'Measure with this device' }).click();
  await plain.page.getByText('reports no orientation sensor').waitFor({ timeout: 6000 });
  assert.equal(await plain.page.getByLabel('Backrest', { exact: true }).inputValue(), '65', 'the box stays as it was');
  await plain.context.close();
});
