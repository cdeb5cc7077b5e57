#!/usr/bin/env node
// Command line of the Fieldbound engine. The code lives in ../dist/cli/main.js (built from src/cli).
let cli;
try {
  cli = await import('../dist/cli/main.js');
} catch (e) {
  if (e && e.code === 'ERR_MODULE_NOT_FOUND' && String(e.message).includes('main.js')) {
    process.stderr.write('fieldbound: the engine is not built; run `npm run build -w shared` first\n');
    process.exit(1);
  }
  throw e;
}
process.exitCode = await cli.main(process.argv.slice(2));
