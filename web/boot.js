// Starts the app: loads the WebAssembly module from this same folder, then
// registers the offline worker (sw.js, beside this file) and tells the app
// when a new version is waiting. Nothing is fetched from anywhere else.
import init, { start } from './plumbline.js';

init().then(() => start()).catch((error) => {
  const note = document.createElement('p');
  note.className = 'boot-error';
  note.textContent = 'Plumbline could not start in this browser: ' + error;
  document.body.append(note);
});

if ('serviceWorker' in navigator) {
  const workers = navigator.serviceWorker;
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
    // gets round to it; offline the check simply fails.
    registration.update().catch(() => {});
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
