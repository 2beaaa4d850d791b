// Starts the bare page as Plumbline's boot.js starts the bedside screen.
import init, { start } from './bare.js';

init().then(() => start());
