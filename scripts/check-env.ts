import { parseEnv } from '../lib/env';

// `npm run serve` runs this before anything else: the env file is complete for a real space, or the
// start stops here with one line per missing or wrong variable.
try {
  parseEnv(process.env);
} catch (err) {
  console.error((err as Error).message);
  process.exit(2);
}
