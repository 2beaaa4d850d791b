// Offline, installable, and at home in any folder of a static host.
//
//   1. after one visit the app opens and works with the network off; with
//      the worker blocked the same reload fails (the control)
//   2. a new build: the page offers it, taking it keeps the open check,
//      and the old build's cache is gone
//   3. published at a sub-path (tools/plumbline/): worker scope, manifest
//      and icons, offline, share links, nothing asked outside the folder
//   4. another page loads the module and calls check() and
//      shareFragment(); the screen does not mount there
//   5. a first visit transfers each file of the build once (the server's
//      own log), and the worker keeps every one of them
//   6. a damaged file in the worker's cache is fetched again at the next
//      start; with no network the page says so plainly, and heals once
//      the network is back
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync, writeFileSync, utimesSync } from 'node:fs';
import { join } from 'node:path';
import { serveCopy, launch, open, until, caseJsonOf, checkWithCli, screenshotPath, showSource } from './harness.mjs';

let chrome;

before(async () => {
  chrome = await launch();
});

after(async () => {
  await chrome?.close();
});

const radial = (page) => showSource(page);
const ready = (page) => page.getByRole('heading', { name: "At the organs' own height" }).waitFor();

/** Waits until the offline worker is active and controls the page. */
async function controlled(page) {
  await page.evaluate(() => navigator.serviceWorker.ready);
  await until(() => page.evaluate(() => Boolean(navigator.serviceWorker.controller)), 'a controlling worker');
}

/** Types a mean and waits until the case has it. */
async function typeMean(page, mean) {
  await (await radial(page)).getByLabel('Mean', { exact: true }).fill(mean);
  await until(async () => JSON.parse(await caseJsonOf(page)).arterial[0].mean === `${mean} mmHg`, `mean ${mean}`);
}

test('after one visit the app opens and works offline; without the worker it does not', async () => {
  const site = await serveCopy();
  try {
    const { page, context, foreign, problems } = await open(chrome.browser, site.url);
    await controlled(page);
    await context.setOffline(true);
    await page.reload();
    await ready(page);
    await typeMean(page, '95');
    const cpp = organCpp(page);
    await until(async () => (await cpp.textContent()) !== '', 'a CPP');
    await page.getByRole('button', { name: 'New check' }).click();
    await page.getByText('No answer yet. To check, enter:').waitFor();
    assert.deepEqual(foreign, [], 'no request leaves the app');
    assert.deepEqual(problems.filter((p) => !p.includes('ERR_INTERNET_DISCONNECTED')), [], 'no script errors');
    await context.close();

    const control = await open(chrome.browser, site.url, { serviceWorkers: 'block' });
    assert.equal(await control.page.evaluate(() => navigator.serviceWorker.controller), null);
    await control.context.setOffline(true);
    await assert.rejects(control.page.reload(), /ERR_INTERNET_DISCONNECTED/);
    await control.context.close();
  } finally {
    site.stop();
  }
});

function organCpp(page) {
  return page.getByRole('region', { name: 'Brain', exact: true }).getByRole('group', { name: 'CPP', exact: true }).locator('.value');
}

test('a new build is offered, keeps the open check, and replaces the old cache', async () => {
  const site = await serveCopy();
  try {
    const { page, context, problems } = await open(chrome.browser, site.url);
    await controlled(page);
    await typeMean(page, '88');
    const [first] = await page.evaluate(() => caches.keys());
    assert.match(first, /^plumbline .* [0-9a-f]{16}$/);
    // A new build: the worker's build hash changes.
    const worker = join(site.dir, 'sw.js');
    writeFileSync(worker, readFileSync(worker, 'utf8').replace(/^const BUILD = '.*';$/m, "const BUILD = 'next-build';"));
    // A real new build comes later than the one-second Last-Modified stamp
    // of the first; rewritten within the same second, the static server
    // would answer the browser's update check "304 not modified".
    const later = new Date(Date.now() + 60_000);
    utimesSync(worker, later, later);
    await page.reload();
    await ready(page);
    const offer = page.getByRole('status').filter({ hasText: 'A new version of Plumbline is ready' });
    await offer.waitFor();
    assert.equal(await (await radial(page)).getByLabel('Mean', { exact: true }).inputValue(), '88');
    await page.screenshot({ path: screenshotPath('update-offer') });
    await offer.getByRole('button', { name: 'Use the new version' }).click();
    await until(async () => {
      const names = await page.evaluate(() => caches.keys());
      return names.length === 1 && names[0].endsWith(' next-build');
    }, 'only the new build cached');
    await ready(page);
    await until(async () => (await page.getByText('A new version of Plumbline is ready').count()) === 0, 'the offer gone');
    assert.equal(await (await radial(page)).getByLabel('Mean', { exact: true }).inputValue(), '88', 'the open check kept');
    assert.deepEqual(problems, [], 'no script errors');
    await context.close();
  } finally {
    site.stop();
  }
});

test('published at a sub-path, worker, manifest and icons work there, offline too', async () => {
  const site = await serveCopy({ subPath: 'tools/plumbline/' });
  try {
    const { page, context, foreign, problems } = await open(chrome.browser, site.url);
    await controlled(page);
    const scope = await page.evaluate(async () => (await navigator.serviceWorker.ready).scope);
    assert.equal(scope, site.url);
    const manifest = await page.evaluate(async () => {
      const href = document.querySelector('link[rel="manifest"]').href;
      const json = await (await fetch(href)).json();
      const icons = await Promise.all(json.icons.map(async (i) => {
        const r = await fetch(new URL(i.src, href));
        return [i.src, r.ok, r.headers.get('content-type')];
      }));
      return { href, json, icons };
    });
    assert.equal(manifest.href, `${site.url}manifest.webmanifest`);
    assert.equal(manifest.json.start_url, './');
    assert.equal(manifest.json.display, 'standalone');
    for (const [src, ok, type] of manifest.icons) assert.ok(ok && /^image\//.test(type), `${src}: ${type}`);
    assert.ok(manifest.json.icons.some((i) => i.purpose === 'maskable'));

    await page.getByRole('button', { name: /^Share/ }).click();
    const link = await page.getByLabel('Link to this check').inputValue();
    assert.ok(link.startsWith(`${site.url}#p1.`), link);
    await page.getByRole('button', { name: 'Close' }).click();

    await context.setOffline(true);
    await page.goto(link);
    await page.getByRole('status').filter({ hasText: 'Opened the check from the shared link' }).waitFor();
    await typeMean(page, '71');
    assert.deepEqual(foreign, [], 'nothing asked outside tools/plumbline/');
    assert.deepEqual(problems, [], 'no script errors');
    await context.close();
  } finally {
    site.stop();
  }
});

test('another page calls check() and shareFragment(); the screen does not mount there', async () => {
  const demo = JSON.parse(readFileSync(new URL('../../examples/beach-chair.json', import.meta.url), 'utf8'));
  const site = await serveCopy({
    change: (dir) => {
      writeFileSync(join(dir, 'other.html'),
        '<!doctype html><meta charset="utf-8"><title>other</title><link rel="icon" href="icon.svg"><script type="module" src="other.js"></script>');
      writeFileSync(join(dir, 'other.js'), `
        import init, { check, shareFragment } from './plumbline.js';
        await init();
        const demo = ${JSON.stringify(demo)};
        window.answers = {
          good: check(demo),
          bad: check({ format: 'plumbline-case', version: 1,
            arterial: [{ id: 'a', method: 'cuff', level: 'heart', systolic: '120' }] }),
          notACase: check('text'),
          link: shareFragment(demo),
        };
        document.title = 'done';
      `);
    },
  });
  try {
    const { page, context, foreign, problems } = await open(chrome.browser, site.url, { address: `${site.url}other.html`, wait: false });
    await until(async () => (await page.title()) === 'done', 'the calls');
    const answers = await page.evaluate(() => window.answers);
    assert.equal(answers.good.ok, true);
    assert.deepEqual(answers.good.errors, []);
    const cli = checkWithCli(JSON.stringify(demo));
    assert.deepEqual(shape(answers.good.report), shape(cli), 'the report the command line gives');
    assert.deepEqual(
      answers.good.report.organs.map((o) => o.metrics.map((m) => Math.round(m.value_mmhg * 1e6))),
      cli.organs.map((o) => o.metrics.map((m) => Math.round(m.value_mmhg * 1e6))),
    );
    assert.equal(answers.bad.ok, false);
    assert.equal(answers.bad.errors[0].field, 'arterial[0].systolic');
    assert.match(answers.bad.errors[0].message, /unit/);
    assert.equal(answers.notACase.ok, false);
    assert.equal(answers.link.ok, true);
    assert.match(answers.link.fragment, /^p1\.[A-Za-z0-9_-]+$/);
    assert.equal(await page.locator('header.top').count(), 0, 'the screen did not mount');
    assert.deepEqual(foreign, []);
    assert.deepEqual(problems, []);
    await context.close();
  } finally {
    site.stop();
  }
});

/** A report's keys and value types, numbers left out (they may differ in the last bit). */
function shape(value) {
  if (Array.isArray(value)) return value.map(shape);
  if (value && typeof value === 'object') return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, shape(v)]));
  return typeof value === 'number' ? 'number' : value;
}

/** The build's files and their SHA-256, as build-web.sh wrote them into sw.js. */
function buildFiles(dir) {
  const worker = readFileSync(join(dir, 'sw.js'), 'utf8');
  return JSON.parse(worker.match(/^const FILES = (\{.*\});$/m)[1]);
}

/** What the worker's cache holds for each file, as SHA-256 in hex. */
function cachedDigests(page) {
  return page.evaluate(async () => {
    const [name] = await caches.keys();
    const cache = await caches.open(name);
    const out = {};
    for (const request of await cache.keys()) {
      const bytes = await (await cache.match(request)).arrayBuffer();
      const hash = new Uint8Array(await crypto.subtle.digest('SHA-256', bytes));
      out[new URL(request.url).pathname.split('/').pop()] = Array.from(hash, (b) => b.toString(16).padStart(2, '0')).join('');
    }
    return out;
  });
}

/** Overwrites the worker's copy of `file` with other bytes. */
function damage(page, file) {
  return page.evaluate(async (file) => {
    const [name] = await caches.keys();
    const cache = await caches.open(name);
    const url = new URL(file, location.href).href;
    await cache.put(url, new Response('not the build', { headers: { 'Content-Type': 'application/wasm' } }));
  }, file);
}

test('a first visit transfers each file once, and the worker keeps every file', async () => {
  const site = await serveCopy({ subPath: 'ward/' });
  try {
    const { page, context, problems } = await open(chrome.browser, site.url);
    await controlled(page);
    // Active, so installed: every file cached, with its own bytes.
    const files = buildFiles(site.dir);
    assert.deepEqual(await cachedDigests(page), files);
    // The server's log: each file's bytes crossed the network once (the
    // page's own address counting as index.html).
    const transfers = {};
    for (const { method, path, status } of site.log) {
      if (method !== 'GET' || status !== 200) continue;
      const name = path.slice('/ward/'.length) || 'index.html';
      transfers[name] = (transfers[name] ?? 0) + 1;
    }
    for (const [name, n] of Object.entries(transfers)) assert.equal(n, 1, `${name} transferred ${n} times`);
    for (const name of Object.keys(files)) assert.equal(transfers[name], 1, `${name} transferred once`);
    // A second start transfers nothing but the worker's own script check.
    const before = site.log.length;
    await page.reload();
    await ready(page);
    const again = site.log.slice(before).filter((r) => r.status === 200 && !r.path.endsWith('/sw.js'));
    assert.deepEqual(again, [], 'nothing fetched again');
    assert.deepEqual(problems, [], 'no script errors');
    await context.close();
  } finally {
    site.stop();
  }
});

test('a damaged cached file is fetched again; with no network the page says so, then heals', async () => {
  const site = await serveCopy();
  try {
    const { page, context, problems } = await open(chrome.browser, site.url);
    await controlled(page);
    const files = buildFiles(site.dir);
    await until(async () => Object.keys(await cachedDigests(page)).length === Object.keys(files).length, 'every file cached');
    await damage(page, 'plumbline_bg.wasm');
    assert.notEqual((await cachedDigests(page))['plumbline_bg.wasm'], files['plumbline_bg.wasm']);
    await page.reload();
    await ready(page);
    await typeMean(page, '72');
    assert.equal((await cachedDigests(page))['plumbline_bg.wasm'], files['plumbline_bg.wasm'], 'healed');

    // No network and nothing in the browser's cache: said plainly.
    await damage(page, 'plumbline_bg.wasm');
    const cdp = await context.newCDPSession(page);
    await cdp.send('Network.clearBrowserCache');
    await context.setOffline(true);
    await page.reload();
    const words = page.getByRole('alert').filter({ hasText: 'Part of Plumbline kept on this device is damaged (plumbline_bg.wasm)' });
    await words.waitFor();
    assert.match(await words.textContent(), /Connect to the network once/);
    await page.screenshot({ path: screenshotPath('damaged-offline') });
    // The network back: the next start repairs it, and the check is there.
    await context.setOffline(false);
    await page.reload();
    await ready(page);
    assert.equal(await (await radial(page)).getByLabel('Mean', { exact: true }).inputValue(), '72');
    assert.equal((await cachedDigests(page))['plumbline_bg.wasm'], files['plumbline_bg.wasm'], 'healed again');
    assert.deepEqual(problems.filter((p) => !/ERR_INTERNET_DISCONNECTED|Failed to fetch|damaged|WebAssembly|Failed to load/.test(p)), [], 'no other script errors');
    await context.close();
  } finally {
    site.stop();
  }
});
