// Uniform console output for the bootstrap scripts.
const tag = '\x1b[36m[fieldbound]\x1b[0m';

export function step(message) {
  console.log(`${tag} ${message}`);
}

/** An error whose message is meant for the person at the terminal: printed without a stack. */
export class BootstrapError extends Error {
  constructor(message) {
    super(message);
    this.name = 'BootstrapError';
  }
}

export function failAndExit(error) {
  if (error instanceof BootstrapError) {
    console.error(`${tag} \x1b[31merror:\x1b[0m ${error.message}`);
  } else {
    console.error(error);
  }
  process.exit(1);
}
