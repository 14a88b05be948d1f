import { readFileSync } from 'node:fs';
import path from 'node:path';
import { expect, it } from 'vitest';

// Every line a scheduled job writes carries an id of its run (`job-<uuid>`), as a request's lines carry the
// request's id, so one run's lines can be found together. Read from the log of the app this suite runs
// (scripts/test.sh writes it to $OHM_TEST_RUN_DIR/app.log): at start the reminder sweep catches up on the
// demo's overdue loans and says so.
type Line = { requestId?: string; job?: string; msg?: string };

const readLog = (): Line[] =>
  readFileSync(path.join(process.env.OHM_TEST_RUN_DIR!, 'app.log'), 'utf8')
    .split('\n')
    .filter((l) => l.startsWith('{'))
    .map((l) => JSON.parse(l) as Line);

it('scheduled jobs log under an id of their run, never "none"', async () => {
  // The catch-up sweep runs once the job queue has started, which may be just after the app answers.
  const deadline = Date.now() + 50_000;
  while (!readLog().some((l) => l.job === 'reminder-sweep') && Date.now() < deadline)
    await new Promise((r) => setTimeout(r, 500));
  const jobLines = readLog().filter((l) => l.job);
  expect(jobLines.map((l) => l.job)).toContain('reminder-sweep');
  for (const l of jobLines) expect(l.requestId, `${l.job}: ${l.msg}`).toMatch(/^job-[0-9a-f-]{36}$/);
});
