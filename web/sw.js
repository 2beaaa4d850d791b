// Plumbline's offline worker: keeps every file of this build in one cache,
// named for this build, answers the app's own requests from it, and never
// touches a request for any other origin. scripts/build-web.sh writes BUILD
// (a hash of the build's files) and FILES (every file beside this one); a
// new build is a new worker, which waits until the page asks for it.
const BUILD = 'unbuilt';
const FILES = [];

// The scope keeps copies of the app published at two paths of one host apart.
const FAMILY = `plumbline ${self.registration.scope} `;
const CACHE = FAMILY + BUILD;

self.addEventListener('install', (event) => {
  event.waitUntil(
    caches.open(CACHE).then((cache) =>
      cache.addAll(FILES.map((file) => new Request(file, { cache: 'reload' })))),
  );
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

// The page sends this when the clinician chooses the new version.
self.addEventListener('message', (event) => {
  if (event.data === 'apply-update') self.skipWaiting();
});

self.addEventListener('fetch', (event) => {
  const request = event.request;
  const url = new URL(request.url);
  const scope = self.registration.scope;
  if (request.method !== 'GET' || url.origin !== self.location.origin || !url.href.startsWith(scope)) {
    return;
  }
  // Any page of the app is the app's one page; a file by its path alone.
  const key = request.mode === 'navigate' ? new URL('index.html', scope).href : url.origin + url.pathname;
  event.respondWith(
    caches.open(CACHE)
      .then((cache) => cache.match(key, { ignoreSearch: true }))
      .then((hit) => hit || fetch(request)),
  );
});
