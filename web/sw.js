// Plumbline's offline worker: keeps every file of this build in one cache,
// named for this build, answers the app's own requests from it, and never
// touches a request for any other origin. scripts/build-web.sh writes
// BUILD (a hash of the build's files) and FILES (each file beside this one
// with the SHA-256 of its bytes); a new build is a new worker, which waits
// until the page asks for it.
//
// Nothing is fetched twice: a file is taken from an earlier build's cache
// when its bytes are this build's, else from the browser's own cache (the
// page has just loaded it), and only else from the network. Every cached
// file is checked against FILES whenever the app starts; a damaged or
// missing one is fetched again, and one that cannot be (no network) is
// named to the page, which says so, instead of breaking every start.
const BUILD = 'unbuilt';
const FILES = {};

// The scope keeps copies of the app published at two paths of one host apart.
const FAMILY = `plumbline ${self.registration.scope} `;
const CACHE = FAMILY + BUILD;

const address = (file) => new URL(file, self.registration.scope).href;

/** The SHA-256 of a response's bytes, in hex. */
async function digest(response) {
  const bytes = await response.clone().arrayBuffer();
  const hash = new Uint8Array(await crypto.subtle.digest('SHA-256', bytes));
  return Array.from(hash, (b) => b.toString(16).padStart(2, '0')).join('');
}

/** Whether `response` holds exactly this build's `file`. */
async function sound(file, response) {
  return Boolean(response?.ok) && (await digest(response)) === FILES[file];
}

/**
 * This build's `file` from the browser's cache if it holds these bytes,
 * else from the network; null when neither gives them (offline, or a
 * host serving something else).
 */
async function download(file) {
  // The page itself was loaded as the folder's address, not by its name.
  const names = file === 'index.html' ? ['./', file] : [file];
  const ways = [...names.map((name) => [name, 'force-cache']), [file, 'reload']];
  for (const [name, cache] of ways) {
    try {
      const response = await fetch(address(name), { cache });
      if (await sound(file, response)) return response;
    } catch {
      // Offline: the next way, or none.
    }
  }
  return null;
}

self.addEventListener('install', (event) => {
  event.waitUntil((async () => {
    const cache = await caches.open(CACHE);
    const older = (await caches.keys()).filter((name) => name.startsWith(FAMILY) && name !== CACHE);
    await Promise.all(Object.keys(FILES).map(async (file) => {
      let response = null;
      for (const name of older) {
        const kept = await (await caches.open(name)).match(address(file));
        if (await sound(file, kept)) {
          response = kept;
          break;
        }
      }
      response ??= await download(file);
      if (!response) throw new Error(`${file}: this build's bytes could not be fetched`);
      await cache.put(address(file), response);
    }));
  })());
});

self.addEventListener('activate', (event) => {
  event.waitUntil(
    caches.keys()
      .then((names) => Promise.all(names
        .filter((name) => name.startsWith(FAMILY) && name !== CACHE)
        .map((name) => caches.delete(name))))
      .then(() => self.clients.claim()),
  );
});

// Each file's check at the last start: true when the cache holds its
// bytes (kept or fetched again), false when it could not be healed.
let checks = null;

/** Checks one cached file against FILES, fetching it again when bad. */
async function heal(file) {
  try {
    const cache = await caches.open(CACHE);
    if (await sound(file, await cache.match(address(file)))) return true;
    const fresh = await download(file);
    if (!fresh) return false;
    await cache.put(address(file), fresh);
    return true;
  } catch {
    return false;
  }
}

/** Starts the check of every file of the build. */
function checkAll() {
  checks = new Map(Object.keys(FILES).map((file) => [file, heal(file)]));
}

/** The files that could not be healed at the last check, by name. */
async function damaged() {
  if (!checks) checkAll();
  const results = await Promise.all([...checks].map(async ([file, ok]) => ((await ok) ? null : file)));
  return results.filter(Boolean).sort();
}

// The page sends 'apply-update' when the clinician chooses the new
// version, and 'damaged' (with a port for the answer) to learn which
// files could not be healed.
self.addEventListener('message', (event) => {
  if (event.data === 'apply-update') self.skipWaiting();
  if (event.data === 'damaged') {
    event.waitUntil(damaged().then((files) => event.ports[0]?.postMessage(files)));
  }
});

/** The page shown when the app's own page is damaged and the network is away. */
function damagedPage() {
  const words = 'Plumbline could not start: its page kept on this device is damaged, '
    + 'and the network is not reachable to fetch it again. Connect to the network once '
    + 'and open Plumbline again; the check saved on this device is kept.';
  return new Response(`<!doctype html><meta charset="utf-8"><title>Plumbline</title><p>${words}</p>`, {
    status: 503,
    headers: { 'Content-Type': 'text/html; charset=utf-8' },
  });
}

self.addEventListener('fetch', (event) => {
  const request = event.request;
  const url = new URL(request.url);
  const scope = self.registration.scope;
  if (request.method !== 'GET' || url.origin !== self.location.origin || !url.href.startsWith(scope)) {
    return;
  }
  // Any page of the app is the app's one page; a file by its path alone.
  const navigate = request.mode === 'navigate';
  const file = navigate ? 'index.html' : url.pathname.slice(new URL(scope).pathname.length);
  if (!(file in FILES)) return;
  event.respondWith((async () => {
    // Each start checks every file; a file waits for its own check.
    if (navigate || !checks) checkAll();
    const kept = (await checks.get(file)) && (await (await caches.open(CACHE)).match(address(file)));
    if (kept) return kept;
    try {
      return await fetch(request);
    } catch (error) {
      if (navigate) return damagedPage();
      throw error;
    }
  })());
});
