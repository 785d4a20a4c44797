// Entry point of the bundled `ralenti` program (dist/cli/ralenti.mjs).
import { runFromProcess } from './ralenti';

runFromProcess();
