// Times the record workloads as wasm in Debian's headless Chromium (the
// eight-hour record's import and analysis, the 72-hour record's import) and
// prints one JSON line. scripts/bench.sh builds the package into target/bench-pkg
// and sets this beside the native numbers.
import { createServer } from 'node:http';
import { readFile } from 'node:fs/promises';
import { join, dirname, extname } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium } from 'playwright-core';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const pkg = join(root, 'target', 'bench-pkg');
const types = { '.js': 'text/javascript', '.wasm': 'application/wasm', '.html': 'text/html' };

const page = `<!doctype html><meta charset="utf-8"><title>bench</title><link rel="icon" href="data:,">
<script type="module">
  import init, { record_csv, import_record as importCsv, Prepared } from './plumbline_bench.js';
  const median = (xs) => xs.sort((a, b) => a - b)[Math.floor(xs.length / 2)];
  const time = (runs, f) => median(Array.from({ length: runs }, () => {
    const t0 = performance.now(); f(); return performance.now() - t0;
  }));
  window.run = async () => {
    await init();
    const text = record_csv(28800);
    const samples = importCsv(text);
    const prepared = new Prepared(text);
    const long = record_csv(259200);
    importCsv(long);
    return {
      rows: 28800,
      samples,
      import_ms: time(15, () => importCsv(text)),
      analyze_ms: time(15, () => prepared.analyze()),
      import_72h_ms: time(9, () => importCsv(long)),
    };
  };
</script>`;

const server = createServer(async (req, res) => {
  const path = new URL(req.url, 'http://127.0.0.1').pathname;
  if (path === '/') {
    res.writeHead(200, { 'content-type': 'text/html' }).end(page);
    return;
  }
  try {
    const body = await readFile(join(pkg, path.slice(1)));
    res.writeHead(200, { 'content-type': types[extname(path)] ?? 'application/octet-stream' }).end(body);
  } catch {
    res.writeHead(404).end();
  }
});
await new Promise((ok) => server.listen(0, '127.0.0.1', ok));
const url = `http://127.0.0.1:${server.address().port}/`;

const browser = await chromium.launch({
  executablePath: '/usr/bin/chromium',
  args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
    '--disable-background-networking', '--disable-component-update', '--disable-sync'],
});
try {
  const tab = await browser.newPage();
  tab.on('pageerror', (e) => console.error(`page error: ${e}`));
  tab.on('console', (m) => { if (m.type() === 'error') console.error(`console: ${m.text()}`); });
  await tab.goto(url);
  await tab.waitForFunction(() => typeof window.run === 'function');
  const result = await tab.evaluate(() => window.run());
  console.log(JSON.stringify(result));
} finally {
  await browser.close();
  server.close();
}
