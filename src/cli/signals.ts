// Installs the SIGINT/SIGTERM handlers as the CLI's first import, so a signal during start-up already exits cleanly.
import { exitCleanlyOnSignals } from '../util/interrupt.js';

exitCleanlyOnSignals();
