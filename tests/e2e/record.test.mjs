// Browser tests of the record over time against the release build in
// dist/: a file opened through the page's own file input gives the numbers
// `plumbline record` gives for the same file and the page's own case.
//
//   1. the demo record: charts and exposure numbers as the CLI's
//   2. a bad file: every problem with its line and column, nothing imported
//   3. an eight-hour record at 1 Hz (28,800 rows): imported, analysed, charted
//   4. "same as last, new time" adds samples; rules change what counts
//   5. a position change changes the exposure as the CLI predicts
//   6. screenshots of the record panel at tablet and phone sizes, dark, print
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync, writeFileSync, mkdtempSync, rmSync } from 'node:fs';
import { execFileSync } from 'node:child_process';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { suite, open, recordWithCli, screenshotPath, root, cli, until, caseJsonOf, unfold, boxGroups } from './harness.mjs';

const demoRecord = join(root, 'examples', 'beach-chair-record.csv');
const demoCsv = readFileSync(demoRecord, 'utf8');

/** How many samples a wide record file holds: its non-empty value cells. */
const cells = (csv) => csv.split('\n').filter((l) => l && !l.startsWith('#')).slice(1)
  .reduce((n, l) => n + l.split(',').slice(1).filter((c) => c.trim() !== '').length, 0);
const demoSamples = cells(demoCsv);

const env = suite();



const panel = (page) => page.getByRole('region', { name: 'Record over time' });

/** Opens the record's other ways in: a monitor export, or the screen as a sample. */
async function moreWays(page) {
  const more = panel(page).locator('details.record-more');
  if (!(await more.evaluate((d) => d.open))) await more.locator(':scope > summary').click();
}

async function openFile(page, name, text) {
  await page.getByLabel('Open a record file (CSV)').setInputFiles({
    name, mimeType: 'text/csv', buffer: Buffer.from(text),
  });
}

/**
 * What the page must show for one of the CLI's targets: the numbers of the
 * core's own summary sentence (`words`), which `plumbline record` prints.
 */
function expectedFor(t) {
  if (t.words.endsWith('no observed time')) return ['no observed time'];
  const m = t.words.match(/for ([\d.]+) min of ([\d.]+) min observed \((\d+)%\), area (-?\d+) mmHg·min, average depth (?:below|above) target (-?[\d.]+) mmHg \(time-weighted\), longest episode ([\d.]+) min(?:; (?:lowest|highest) (-?\d+) mmHg at (\d+:\d\d:\d\d))?/);
  assert.ok(m, `the core's words: ${t.words}`);
  const side = t.at_least ? 'below' : 'above';
  // Labelled so that no exposure figure reads as a pressure.
  const want = [
    `Time ${side} target${m[1]} min of ${m[2]} min observed (${m[3]}%)`,
    `Area ${side} target${m[4]} mmHg·min`,
    `Average depth ${side} target, time-weighted${m[5]} mmHg`,
    `Longest episode${m[6]} min`,
  ];
  if (m[7] !== undefined) want.push(`${t.at_least ? 'Lowest value' : 'Highest value'}${m[7]} mmHg at ${m[8]}`);
  for (const flag of t.words.match(/uses an ASSUMED [^;]+/g) ?? []) want.push(flag.replace(/^uses/, 'Uses'));
  return want;
}

/** Every followed target's numbers on the page are the CLI's. */
async function matchesCli(page, exposure) {
  assert.ok(exposure.targets.length > 0, 'the CLI follows some target');
  for (const t of exposure.targets) {
    const group = panel(page).getByRole('group', { name: t.target, exact: true });
    // The core's status word, as the CLI's table prints it in brackets.
    const word = { met: 'MET', below: 'BELOW', above: 'ABOVE', not_observed: 'NOT OBSERVED' }[t.status] ?? 'NOT EVALUATED';
    assert.equal(exposure.tableStatus[t.target], word, `${t.target}: the table's word`);
    const want = [word, ...expectedFor(t)];
    await until(async () => {
      const text = await group.textContent();
      const missing = want.filter((w) => !text.includes(w));
      return missing.length === 0 || Promise.reject(new Error(`${t.target}: ${missing.join(' | ')} in ${text}`));
    }, `the numbers of ${t.target}`);
  }
  const ruleWords = exposure.rules.charAt(0).toUpperCase() + exposure.rules.slice(1);
  await panel(page).getByText(`${ruleWords}.`, { exact: true }).waitFor();
  await panel(page).getByText(`Targets not followed (${exposure.not_analysed.length})`).waitFor();
}

/** `plumbline record CSV --case CASE --series`: the organ-level series as CSV. */
function seriesWithCli(csvText, caseJson) {
  const dir = mkdtempSync(join(tmpdir(), 'plumbline-series-'));
  writeFileSync(join(dir, 'r.csv'), csvText);
  writeFileSync(join(dir, 'case.json'), caseJson);
  try {
    return execFileSync(cli(), ['record', join(dir, 'r.csv'), '--case', join(dir, 'case.json'), '--series'], { encoding: 'utf8' });
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** Clicks a download button and returns the file's text. */
async function download(page, name) {
  const [file] = await Promise.all([
    page.waitForEvent('download'),
    panel(page).getByRole('button', { name }).click(),
  ]);
  return readFileSync(await file.path(), 'utf8');
}

/** The number of samples the summary line states. */
async function samples(page) {
  const text = await panel(page).locator('.record-summary').textContent();
  const m = text.match(/^(\d+) samples/);
  return m ? Number(m[1]) : 0;
}

test('a record file opened on the page gives the CLI\'s exposure, charted', async () => {
  const { page, context, foreign, problems } = await open(env.chrome.browser, env.server.url);
  const json = await caseJsonOf(page);
  await openFile(page, 'beach-chair-record.csv', demoCsv);
  const cpp = panel(page).getByRole('region', { name: 'Brain · CPP' });
  await cpp.waitFor();
  const exposure = recordWithCli(demoCsv, json);
  await matchesCli(page, exposure);
  await until(async () => (await samples(page)) === demoSamples, 'the summary of the samples');

  // The chart: the curve, the floor's line and its hatched area, the worst ringed.
  const chart = cpp.getByRole('img');
  assert.match(await chart.getAttribute('aria-label'), /^Brain · CPP over 0:20:00: from \d+ to \d+ mmHg; hatched where below 60 mmHg/);
  assert.equal(await chart.locator('path.trend-curve').count(), 1);
  const shade = await chart.locator('path.shade-low').first().getAttribute('d');
  assert.ok(shade.length > 100, 'CPP below 60 is hatched');
  assert.equal(await chart.locator('circle.worst').count(), 1);
  const map = panel(page).getByRole('region', { name: 'Whole body · MAP at the heart' });
  assert.equal(await map.getByRole('img').locator('line.series').count(), 2, 'two targets on MAP');
  // Status in words and shapes, not colour alone.
  assert.ok((await cpp.textContent()).includes('BELOW'));
  await panel(page).getByText('Channels and how time between samples counts (4)').click();
  await panel(page).getByText(/left arm cuff\.mean: \d+ samples, each held until the next \(intermittent\); estimated from systolic and diastolic/).waitFor();
  assert.deepEqual(foreign, [], 'no request leaves 127.0.0.1');
  assert.deepEqual(problems, [], 'no script errors');
  await context.close();
});

test('a bad file shows every problem with its line and column and imports nothing', async () => {
  const { page, context } = await open(env.chrome.browser, env.server.url);
  await openFile(page, 'beach-chair-record.csv', demoCsv);
  await until(async () => (await samples(page)) === demoSamples, 'the demo record');
  const bad = 'elapsed_s,radial line.mean [mmHg],femoral.mean [mmHg]\n0,74,1\nx,70,\n5,700,\n3,70,\n';
  await openFile(page, 'bad.csv', bad);
  const box = panel(page).getByRole('region', { name: 'bad.csv was not opened: nothing imported' });
  await box.waitFor();
  // The CLI names the same problems, in the same words.
  let stderr = '';
  try {
    recordWithCli(bad, await caseJsonOf(page));
  } catch (e) {
    stderr = String(e.stderr);
  }
  const expected = stderr.split('\n').filter((l) => l.startsWith('  line'))
    .map((l) => l.trim().replace(/^line/, 'Line'));
  assert.ok(expected.length >= 3, stderr);
  const shown = await box.getByRole('listitem').allTextContents();
  assert.deepEqual(shown, expected);
  assert.ok(shown.some((l) => l.startsWith('Line 1, column 3: ')), 'the unknown column');
  assert.ok(shown.some((l) => l.startsWith('Line 4, column 2: ')), 'the value out of range');
  assert.equal(await samples(page), demoSamples, 'the record on screen is unchanged');
  // A good file again clears the problems.
  await openFile(page, 'beach-chair-record.csv', demoCsv);
  await until(async () => (await box.count()) === 0, 'the problems to clear');
  await context.close();
});

/**
 * The benchmark's eight-hour record (crates/bench record_csv: the same
 * formulas), with the demo case's channel names: a line at 1 Hz, the cuff
 * every 3 minutes, CVP and ICP at 1 Hz.
 */
function eightHours(rows = 28800) {
  const out = ['elapsed_s,radial line.mean [mmHg],left arm cuff.mean [mmHg],cvp [mmHg],icp [mmHg]'];
  for (let t = 0; t < rows; t += 1) {
    const map = 72 + 9 * Math.sin(t / 900) + 2 * Math.sin(t / 13);
    const cuff = t % 180 === 0 ? (map + 20).toFixed(0) : '';
    const cvp = 6 + 2 * Math.cos(t / 600);
    const icp = 11 + 4 * Math.sin(t / 1700);
    out.push(`${t},${map.toFixed(1)},${cuff},${cvp.toFixed(1)},${icp.toFixed(1)}`);
  }
  return `${out.join('\n')}\n`;
}

test('an eight-hour record at 1 Hz imports, analyses and charts without freezing the page', async (t) => {
  const { page, context, problems } = await open(env.chrome.browser, env.server.url);
  // The record's CVP and ICP need readings in the case to give their levels.
  await unfold(page, 'Other pressures');
  for (const [name, value] of [['ICP', '10'], ['CVP', '6']]) {
    await page.getByLabel('Pressure to add').selectOption({ label: name });
    await page.getByRole('button', { name: 'Add measured' }).click();
    await page.getByRole('group', { name: `${name} (measured)` }).getByLabel(name, { exact: true }).fill(value);
  }
  await until(async () => JSON.parse(await caseJsonOf(page)).readings?.cvp, 'the CVP reading');
  const json = await caseJsonOf(page);
  const csv = eightHours();
  await page.evaluate(() => {
    window.longest = 0;
    new PerformanceObserver((list) => {
      for (const e of list.getEntries()) window.longest = Math.max(window.longest, e.duration);
    }).observe({ type: 'longtask', buffered: false });
  });
  const t0 = Date.now();
  await openFile(page, 'eight-hours.csv', csv);
  const map = panel(page).getByRole('region', { name: 'Whole body · MAP at the heart' });
  await map.waitFor({ timeout: 30000 });
  const shown = Date.now() - t0;
  assert.equal(await samples(page), cells(csv));
  assert.equal(cells(csv), 3 * 28800 + 160);
  const exposure = recordWithCli(csv, json);
  await matchesCli(page, exposure);
  // Drawn from a few hundred pixel columns, not 28,800 points.
  const d = await map.getByRole('img').locator('path.trend-curve').first().getAttribute('d');
  const points = (d.match(/[ML]/g) ?? []).length;
  assert.ok(points < 1300, `${points} points drawn`);
  const importTask = await page.evaluate(() => window.longest);

  // Typing elsewhere stays quick: the analysis waits for a pause.
  await page.evaluate(() => { window.longest = 0; });
  await unfold(page, 'Arterial sources');
  await page.getByRole('group', { name: /Arterial source 1/ }).getByText(/separate boxes/).click();
  const mean = page.getByRole('group', { name: /Arterial source 1/ }).getByLabel('Mean', { exact: true });
  await mean.click();
  const typed0 = Date.now();
  await page.keyboard.press('End');
  for (const key of ['Backspace', 'Backspace', '8', '0', 'Backspace', 'Backspace', '7', '4']) {
    await page.keyboard.press(key);
  }
  const typing = Date.now() - typed0;
  await until(async () => (await mean.inputValue()) === '74', 'the typed mean');
  const typingTask = await page.evaluate(() => window.longest);
  await matchesCli(page, exposure);
  // Each panel's boxes are a form of their own, so the browser's read of a
  // form after a keystroke covers one panel, not every box on the page.
  const groups = await boxGroups(page);
  assert.deepEqual(groups.loose, [], 'no box outside a form');
  assert.ok(groups.largest <= 30, `${groups.largest} of ${groups.boxes} boxes in one form`);
  // Eight hours do not fit a link: the dialog says so and offers the file.
  await page.getByRole('button', { name: /^Share/ }).click();
  const dialog = page.getByRole('dialog', { name: 'Share this check' });
  await dialog.getByText(/The record over time is NOT in this link/).waitFor();
  await dialog.getByRole('button', { name: 'Download case with record (JSON)' }).waitFor();
  const link = await dialog.getByLabel('Link to this check').inputValue();
  assert.ok(link.split('#')[1].length <= 16 * 1024, 'the link itself stays within the cap');
  await dialog.getByRole('button', { name: 'Close' }).click();
  t.diagnostic(`eight hours: shown ${shown} ms after choosing the file; longest task ${importTask.toFixed(0)} ms; `
    + `8 keystrokes ${typing} ms, longest task while typing ${typingTask.toFixed(0)} ms`);
  assert.deepEqual(problems, [], 'no script errors');
  await context.close();
});

test('"same as last, new time" adds the readings on screen; the rules change what counts', async () => {
  const { page, context } = await open(env.chrome.browser, env.server.url);
  const p = panel(page);
  await moreWays(page);
  await p.getByLabel('Time of the entry').selectOption('elapsed');
  const when = p.getByLabel('Elapsed time');
  const add = p.getByRole('button', { name: /Same as last, new time/ });
  await when.fill('0:00');
  // From the keyboard: Tab from the time box reaches the button, Enter taps it.
  await when.focus();
  await page.keyboard.press('Tab');
  assert.equal(await page.evaluate(() => document.activeElement?.textContent), 'Same as last, new timeadds the readings on screen as a sample');
  await page.keyboard.press('Enter');
  await until(async () => (await samples(page)) === 6, 'the first sample (six readings)');
  await page.getByText('Added 6 readings at 0:00:00.').waitFor();
  await when.fill('+5');
  await add.click();
  await until(async () => (await samples(page)) === 12, 'a second sample');
  // A refused entry says why beside the box and adds nothing.
  await when.fill('0:05:00');
  await add.click();
  await p.getByText(/already has a radial line.systolic sample at 0:05:00/).waitFor();
  assert.equal(await samples(page), 12);
  // The line dips; the next sample takes the new value.
  await unfold(page, 'Arterial sources');
  await page.getByRole('group', { name: /Arterial source 1/ }).getByText(/separate boxes/).click();
  await page.getByRole('group', { name: /Arterial source 1/ }).getByLabel('Mean', { exact: true }).fill('60');
  await until(async () => JSON.parse(await caseJsonOf(page)).arterial[0].mean === '60 mmHg', 'the new mean');
  await when.fill('+5');
  await add.click();
  await until(async () => (await samples(page)) === 18, 'a third sample');
  const map = p.getByRole('group', { name: 'MAP at the heart at least 65 mmHg', exact: true });
  // Line samples five minutes apart are not joined under the default rules.
  await until(async () => (await map.textContent()).includes('no observed time'), 'unobserved line samples');
  await p.getByText('Change the rules (hold, gap, shortest episode)').click();
  await p.getByLabel('Join line or sensor samples across gaps of at most').fill('600');
  await until(async () => (await map.textContent()).includes('min of 10.0 min observed'), 'the joined line');
  await p.getByText(/continuous samples interpolated across gaps of at most 10 min/).waitFor();
  // The CLI reads the downloaded samples and case to the same numbers.
  const samplesCsv = await download(page, 'Download samples (record CSV)');
  const whole = await download(page, 'Download case with record (JSON)');
  assert.equal(JSON.parse(whole).timeline.rules.gap_max_s, 600);
  assert.equal(JSON.parse(whole).timeline.clock_start, undefined, 'no clock, no date');
  await matchesCli(page, recordWithCli(samplesCsv, whole));
  // A rule out of range gets the core's message beside its box.
  await p.getByLabel('Ignore episodes shorter than').fill('7200');
  await until(async () => (await page.locator('#f-timeline-rules-min_episode_s-msg').textContent()).includes('7200 s'), 'the rule\'s message');
  await context.close();
});

test('a position change changes the exposure as the CLI predicts', async () => {
  const { page, context, foreign } = await open(env.chrome.browser, env.server.url);
  await openFile(page, 'beach-chair-record.csv', demoCsv);
  const p = panel(page);
  const cpp = p.getByRole('group', { name: 'CPP at least 60 mmHg', exact: true });
  await cpp.waitFor();
  const before = await cpp.locator('.x-area').textContent();
  await page.getByLabel('Posture').selectOption({ label: 'supine' });
  await moreWays(page);
  await until(async () => JSON.parse(await caseJsonOf(page)).position.posture === 'supine', 'supine on screen');
  await p.getByLabel('Time of the entry').selectOption('elapsed');
  await p.getByLabel('Elapsed time').fill('0:10:00');
  await p.getByRole('button', { name: /Mark position change/ }).click();
  await p.getByText(/^From 0:10:00: supine/).waitFor();
  await p.getByText(/^From the start: beach chair, backrest 65°/).waitFor();
  await until(async () => (await cpp.locator('.x-area').textContent()) !== before, 'a new CPP area');
  const whole = await download(page, 'Download case with record (JSON)');
  const doc = JSON.parse(whole);
  assert.equal(doc.position.posture, 'beach_chair', 'the case starts where the record starts');
  assert.equal(doc.timeline.positions[0].at_s, 600);
  const exposure = recordWithCli(demoCsv, whole);
  await matchesCli(page, exposure);
  const area = (a) => Number(a.match(/^(\d+)/)[1]);
  assert.ok(area(await cpp.locator('.x-area').textContent()) < area(before), 'lying flat lifts CPP at the tragus');
  // The chart numbers the change; removing it restores the numbers.
  assert.equal(await p.getByRole('region', { name: 'Brain · CPP' }).getByRole('img').locator('text.now-label').textContent(), '2');
  await p.getByRole('button', { name: 'Remove position change 2 at 0:10:00' }).click();
  await until(async () => (await cpp.locator('.x-area').textContent()) === before, 'the first numbers back');
  const series = await download(page, 'Download organ-level series (CSV)');
  assert.equal(series.split('\n')[0], 'elapsed_s,brain.perfusion [mmHg],brain.inflow [mmHg],whole_body.inflow [mmHg]');
  const now = await download(page, 'Download case with record (JSON)');
  assert.equal(series, seriesWithCli(demoCsv, now), 'the series is the CLI\'s --series');
  // Downloads are made on the device: nothing but the page's own blobs.
  const origin = env.server.url.replace(/\/$/, '');
  assert.deepEqual(foreign.filter((u) => !u.startsWith(`blob:${origin}/`)), []);
  await context.close();
});

const sizes = [
  ['record-tablet-portrait', { width: 768, height: 1024 }, 'light'],
  ['record-tablet-landscape', { width: 1024, height: 768 }, 'light'],
  ['record-phone', { width: 390, height: 844 }, 'light'],
  ['record-dark', { width: 1024, height: 768 }, 'dark'],
];

for (const [name, viewport, colorScheme] of sizes) {
  test(`screenshot ${name}: the record panel fits, its controls are large and labelled`, async () => {
    const { page, context } = await open(env.chrome.browser, env.server.url, { viewport, colorScheme });
    await openFile(page, 'beach-chair-record.csv', demoCsv);
    const p = panel(page);
    await p.getByRole('region', { name: 'Brain · CPP' }).waitFor();
    await p.getByText('Change the rules (hold, gap, shortest episode)').click();
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    assert.ok(overflow <= 0, `page wider than the screen by ${overflow}px`);
    const small = await p.evaluate((el) =>
      [...el.querySelectorAll('button, select, input, summary, label.file-pick')]
        .filter((e) => e.offsetParent !== null)
        .map((e) => [e.id || e.textContent.trim().slice(0, 30), e.getBoundingClientRect().height])
        .filter(([, h]) => h < 44));
    assert.deepEqual(small, [], 'every control at least 44 px tall');
    const unlabelled = await p.evaluate((el) =>
      [...el.querySelectorAll('input, select, textarea')]
        .filter((e) => !e.getAttribute('aria-label') && !document.querySelector(`label[for="${e.id}"]`))
        .map((e) => e.id || e.outerHTML.slice(0, 60)));
    assert.deepEqual(unlabelled, [], 'every box has a label');
    const ids = await page.evaluate(() => [...document.querySelectorAll('[id]')].map((e) => e.id));
    assert.deepEqual(ids.filter((id, i) => ids.indexOf(id) !== i), [], 'ids are unique');
    await p.scrollIntoViewIfNeeded();
    await page.screenshot({ path: screenshotPath(name) });
    await p.screenshot({ path: screenshotPath(`${name}-panel`) });
    await context.close();
  });
}

test('the printed handover carries the exposure numbers, the charts and the readings', async () => {
  const { page, context } = await open(env.chrome.browser, env.server.url);
  await openFile(page, 'beach-chair-record.csv', demoCsv);
  await panel(page).getByRole('region', { name: 'Brain · CPP' }).waitFor();
  await page.emulateMedia({ media: 'print' });
  const numbers = panel(page).getByRole('group', { name: 'CPP at least 60 mmHg', exact: true });
  assert.ok(await numbers.isVisible(), 'the numbers print');
  assert.ok(await panel(page).getByRole('img').first().isVisible(), 'the charts print');
  // A monitor's second-by-second stream is in the chart, not listed on paper.
  const readings = panel(page).getByRole('region', { name: 'Readings of radial line' });
  assert.ok(!(await readings.isVisible()), 'no list of a monitor stream in print');
  assert.ok(!(await page.getByLabel('Open a record file (CSV)').isVisible()), 'no controls in print');
  await page.screenshot({ path: screenshotPath('record-print'), fullPage: true });
  const pdf = (await page.pdf({ format: 'A4', printBackground: true })).toString('latin1');
  const pages = (pdf.match(/\/Type\s*\/Page[^s]/g) ?? []).length;
  assert.ok(pages <= 3, `the handover with its record prints on ${pages} A4 pages`);
  await context.close();
});
