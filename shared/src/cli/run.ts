/// <reference types="node" />
// Process entry of the command line when run from source (tests: `node --import tsx src/cli/run.ts …`).
import { main } from './main.js';

process.exitCode = await main(process.argv.slice(2));
