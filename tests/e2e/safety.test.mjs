// Safe by default, on the real screen: the beach chair with one cuff and no
// ICP judges the brain BELOW with the cuff value to defend, on screen, in
// print and through a shared link, exactly as the command line does; the
// headline never calls an organ fine that could not be judged.
//
//   1. a shared link with the beach-chair case: the brain BELOW, the value
//      to defend, the cord not evaluated, the CLI's own headline
//   2. the same in print (print media)
//   3. a print from the browser's menu just after typing prints the check
//      of what was typed, not the answer before it
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { deflateRawSync } from 'node:zlib';
import { suite, open, checkWithCli, screenshotPath } from './harness.mjs';

const env = suite();

/** The beach chair of the report that opened this work, invented values. */
const BEACH_CHAIR = JSON.stringify({
  format: 'plumbline-case',
  version: 1,
  patient: { height: '180 cm' },
  position: { posture: 'beach_chair', backrest_deg: 70, left_arm: 'side' },
  arterial: [{ id: 'L arm cuff', method: 'cuff', level: 'upper_arm_left', systolic: '100 mmHg', diastolic: '60 mmHg' }],
});

const fragmentOf = (json) => `#p1.${deflateRawSync(Buffer.from(json)).toString('base64url')}`;

async function openBeachChair(options = {}) {
  const opened = await open(env.chrome.browser, env.server.url, {
    ...options,
    address: env.server.url + fragmentOf(BEACH_CHAIR),
  });
  await opened.page.getByRole('status').filter({ hasText: 'Opened the check from the shared link' }).waitFor();
  return opened;
}

test('a shared beach-chair case with no ICP shows the brain BELOW and the cuff value to defend', async () => {
  const report = checkWithCli(BEACH_CHAIR);
  const brain = report.summary.organs.find((l) => l.organ === 'brain');
  assert.equal(brain.status, 'below', 'the command line judges the brain');
  assert.match(brain.defend, /^L arm cuff: mean at least \d+ mmHg$/);

  const { page, context, problems } = await openBeachChair();
  const verdicts = page.getByRole('region', { name: "At the organs' own height" });
  await verdicts.getByText(report.summary.headline, { exact: true }).first().waitFor();
  const text = await verdicts.textContent();
  assert.ok(!/every evaluated target is met/i.test(text), 'no false "all met"');
  assert.ok(text.includes(`Defend ${brain.defend}`), text);
  assert.ok(text.includes('NOT EVALUATED'), 'the cord is named as not evaluated');
  assert.match(report.summary.headline, /Not evaluated: Spinal cord \(needs CSF pressure\)/);
  await page.screenshot({ path: screenshotPath('safety-beach-chair-1024x768'), fullPage: false });
  assert.deepEqual(problems, [], 'no script errors');
  await context.close();
});

test('the brain verdict and the value to defend are in print', async () => {
  const report = checkWithCli(BEACH_CHAIR);
  const brain = report.summary.organs.find((l) => l.organ === 'brain');
  const { page, context } = await openBeachChair();
  await page.emulateMedia({ media: 'print' });
  const headline = page.getByText(report.summary.headline, { exact: true }).first();
  assert.ok(await headline.isVisible(), 'the headline prints');
  const defend = page.getByText(`To meet it now: ${brain.defend}`).first();
  assert.ok(await defend.isVisible(), 'the value to defend prints');
  const verdict = page.locator('section.organ').filter({ hasText: 'Brain' }).getByText('BELOW').first();
  assert.ok(await verdict.isVisible(), 'the brain verdict prints');
  await context.close();
});

test("a print from the browser's menu just after typing prints the check of what was typed", async () => {
  const after = checkWithCli(BEACH_CHAIR.replace('"100 mmHg"', '"150 mmHg"').replace('"60 mmHg"', '"95 mmHg"'));
  const { page, context, problems } = await openBeachChair();
  const pin = page.locator('.answer-pin');
  const before = await pin.textContent();
  assert.ok(!before.includes(after.summary.headline), 'the typed values change the answer');
  // Typed, then printed before the pause for the check is over: only
  // microtasks run between them, as between a keystroke and a quick print.
  const seen = await page.evaluate(async () => {
    const box = document.querySelector('#f-arterial-0-blood_pressure');
    const pinned = document.querySelector('.answer-pin');
    const settle = async () => { for (let i = 0; i < 20; i += 1) await Promise.resolve(); };
    box.value = '150/95';
    box.dispatchEvent(new Event('input', { bubbles: true }));
    await settle();
    const typed = pinned.getAttribute('aria-busy');
    window.dispatchEvent(new Event('beforeprint'));
    await settle();
    return { typed, printed: pinned.getAttribute('aria-busy'), text: pinned.textContent };
  });
  assert.equal(seen.typed, 'true', 'after typing, the answer waits for the pause');
  assert.equal(seen.printed, 'false', 'before print, the typed values are checked');
  assert.ok(seen.text.includes(after.summary.headline), seen.text);
  assert.deepEqual(problems, [], 'no script errors');
  await context.close();
});

test('on a phone, an answer taller than its pinned box fades at the cut, and its end shows whole', async () => {
  const three = JSON.stringify({ ...JSON.parse(BEACH_CHAIR), concern: ['brain', 'cord', 'whole_body'] });
  const { page, context } = await open(env.chrome.browser, env.server.url, {
    viewport: { width: 390, height: 844 },
    address: env.server.url + fragmentOf(three),
  });
  const box = await page.locator('.answer-pin').evaluate((pin) => {
    const fade = getComputedStyle(pin, '::after');
    const overflows = pin.scrollHeight > pin.clientHeight;
    pin.scrollTop = pin.scrollHeight;
    const last = [...pin.querySelectorAll('.verdict')].pop().getBoundingClientRect().bottom;
    const inner = pin.getBoundingClientRect().top + pin.clientTop + pin.clientHeight;
    return { overflows, position: fade.position, fade: parseFloat(fade.height), last, inner };
  });
  assert.ok(box.overflows, 'three organs overflow the pinned box on this phone');
  assert.equal(box.position, 'sticky', 'the fade stays at the bottom edge while more lies below');
  assert.ok(box.last <= box.inner - box.fade + 0.5, `the last organ ends above the fade: ${JSON.stringify(box)}`);
  await context.close();
});
