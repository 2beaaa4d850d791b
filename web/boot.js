// Starts the app: loads the WebAssembly module from this same folder. Nothing is fetched from anywhere else.
import init from './plumbline.js';

init().catch((error) => {
  const note = document.createElement('p');
  note.className = 'boot-error';
  note.textContent = 'Plumbline could not start in this browser: ' + error;
  document.body.append(note);
});
