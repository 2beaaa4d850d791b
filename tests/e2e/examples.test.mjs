// One verdict, two faces: for every example case, the command line's table
// (`plumbline check FILE`) and the screen give every organ and every target
// the same status word. Both only lay out what the core decided, so a
// difference here is a front end deciding on its own.
//
//   1. each example opened through a shared link; each organ's verdict and
//      each target's status on screen equal the table's
//   2. a metric the table lists as needing an input is said to need it on
//      screen, and its targets are not evaluated in the table
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { execFileSync } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { deflateRawSync } from 'node:zlib';
import { suite, open, cli, root, settled } from './harness.mjs';

const env = suite();

const examples = readdirSync(join(root, 'examples')).filter((f) => f.endsWith('.json')).sort();

const fragmentOf = (json) => `#p1.${deflateRawSync(Buffer.from(json)).toString('base64url')}`;

/**
 * The table's organ sections: per organ, its verdict word, and per metric
 * its targets' status words (or, for a metric that could not be computed,
 * `needs`).
 */
function tableOf(file) {
  const text = execFileSync(cli(), ['check', file], { encoding: 'utf8' });
  const organs = new Map();
  let organ;
  let metric;
  for (const line of text.split('\n')) {
    const head = line.match(/^(\S.*): checked at .* \[([A-Z ]+)\]$/);
    if (head) {
      organ = { verdict: head[2], metrics: new Map() };
      organs.set(head[1], organ);
      metric = undefined;
      continue;
    }
    if (!organ) continue;
    if (line === '' || /^\S/.test(line)) {
      organ = undefined;
      continue;
    }
    const target = line.match(/^ {6}\[([A-Z ]+)\] (.+?)(?::| *$)/);
    if (target && metric) {
      metric.targets.set(target[2], target[1]);
      continue;
    }
    const needs = line.match(/^ {2}(\S.*?): needs /);
    const valued = line.match(/^ {2}(\S.*?) +-?\d+ mmHg {2}\(range /);
    if (needs || valued) {
      metric = { needs: Boolean(needs), targets: new Map() };
      organ.metrics.set((needs ?? valued)[1], metric);
    }
  }
  return organs;
}

/** The same as laid out on screen, read from the organ sections. */
function screenOf(page) {
  return page.evaluate(() => [...document.querySelectorAll('section.organ')].map((s) => ({
    label: s.querySelector('h3').textContent,
    verdict: s.querySelector('.organ-verdict .status-word').textContent,
    metrics: [...s.querySelectorAll('.metric')].map((m) => ({
      label: m.getAttribute('aria-label'),
      targets: [...m.querySelectorAll('.verdict-line')].map((v) => [
        v.lastElementChild.textContent,
        v.querySelector('.status-word').textContent,
      ]),
    })),
    missing: [...s.querySelectorAll('.missing')].map((p) => p.textContent),
  })));
}

for (const name of examples) {
  test(`${name}: the table and the screen give every organ and target the same status`, async () => {
    const file = join(root, 'examples', name);
    const table = tableOf(file);
    assert.ok(table.size > 0, 'the table has organ sections');
    const json = readFileSync(file, 'utf8');
    const { page, context, problems } = await open(env.chrome.browser, env.server.url, {
      address: env.server.url + fragmentOf(json),
    });
    await page.getByRole('status').filter({ hasText: 'Opened the check from the shared link' }).waitFor();
    await settled(page);
    const screen = await screenOf(page);
    assert.deepEqual(screen.map((o) => o.label).sort(), [...table.keys()].sort(), 'the same organs');
    for (const organ of screen) {
      const row = table.get(organ.label);
      assert.equal(organ.verdict, row.verdict, `${organ.label}: the organ's verdict`);
      const shown = new Map(organ.metrics.map((m) => [m.label, m]));
      for (const [label, metric] of row.metrics) {
        if (metric.needs) {
          assert.ok(organ.missing.some((t) => t.startsWith(`${label}: needs `)), `${organ.label} ${label}: said to need an input`);
          for (const [target, word] of metric.targets) assert.equal(word, 'NOT EVALUATED', `${organ.label} ${target}`);
          continue;
        }
        const m = shown.get(label);
        assert.ok(m, `${organ.label} ${label}: on screen`);
        const words = new Map(m.targets.map(([text, word]) => [text.split(': ')[0], word]));
        assert.deepEqual([...words.keys()].sort(), [...metric.targets.keys()].sort(), `${organ.label} ${label}: the same targets`);
        for (const [target, word] of metric.targets) {
          assert.equal(words.get(target), word, `${organ.label} ${label} ${target}`);
        }
      }
    }
    assert.deepEqual(problems, [], 'no script errors');
    await context.close();
  });
}
