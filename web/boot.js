// Starts the app: loads the WebAssembly module from this same folder, then
// registers the offline worker (sw.js, beside this file) and tells the app
// when a new version is waiting. Nothing is fetched from anywhere else.
//
// The worker is registered once the module has loaded, so on a first
// visit it finds every file the page used in the browser's cache and
// fetches none of them a second time.
import init, { start } from './plumbline.js';

const workers = 'serviceWorker' in navigator ? navigator.serviceWorker : null;

/** Says something plainly at the top of the page. */
function say(className, words) {
  const note = document.createElement('p');
  note.className = className;
  note.setAttribute('role', 'alert');
  note.textContent = words;
  document.body.prepend(note);
}

/**
 * The files of Plumbline the offline worker found damaged on this device
 * and could not fetch again (no network); none without a worker.
 */
function damagedFiles() {
  const worker = workers?.controller;
  if (!worker) return Promise.resolve([]);
  return new Promise((resolve) => {
    const channel = new MessageChannel();
    channel.port1.onmessage = (event) => resolve(Array.isArray(event.data) ? event.data : []);
    worker.postMessage('damaged', [channel.port2]);
    setTimeout(() => resolve([]), 3000);
  });
}

/** Names damaged files, if the worker found any. */
async function sayDamaged() {
  const files = await damagedFiles();
  if (files.length === 0) return false;
  say('boot-error', `Part of Plumbline kept on this device is damaged (${files.join(', ')}), `
    + 'and the network is not reachable to fetch it again. Connect to the network once and '
    + 'open Plumbline again: it repairs itself. The check saved on this device is kept.');
  return true;
}

function register() {
  if (!workers) return;
  let applying = false;
  // Says so to the app (an attribute too, in case it was not yet listening).
  const ready = () => {
    document.documentElement.setAttribute('data-update-ready', '');
    window.dispatchEvent(new Event('plumbline-update-ready'));
  };
  workers.register('./sw.js').then((registration) => {
    const watch = (worker) => worker?.addEventListener('statechange', () => {
      if (worker.state === 'installed' && workers.controller) ready();
    });
    if (registration.waiting && workers.controller) ready();
    watch(registration.installing);
    registration.addEventListener('updatefound', () => watch(registration.installing));
    // Look for a new version at every start rather than when the browser
    // gets round to it (not on the first visit: the worker was just
    // fetched); offline the check simply fails.
    if (registration.active) registration.update().catch(() => {});
    window.addEventListener('plumbline-apply-update', () => {
      applying = true;
      registration.waiting?.postMessage('apply-update');
    });
  }).catch(() => {
    // No worker (a private window, an old browser): the app works online.
  });
  // The new version took over: reload into it. The check is saved on the
  // device, so it opens as it was.
  workers.addEventListener('controllerchange', () => {
    if (applying) {
      applying = false;
      window.location.reload();
    }
  });
}

init().then(() => {
  start();
  sayDamaged();
}).catch(async (error) => {
  if (!(await sayDamaged())) say('boot-error', `Plumbline could not start in this browser: ${error}`);
}).finally(register);
