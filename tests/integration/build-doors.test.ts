import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { productionBuild } from '../helpers/production-build';

// Finding 3: the test, bench and dev doors are not in the build `npm start` serves. Proved from the
// builds' own route manifests: the test build (scripts/test.sh, OHM_BUILD_DOORS=test,dev) has the test
// hooks and the dev mailbox; a build made the way `npm start` makes it (no OHM_BUILD_DOORS) has none of
// them, nor the bench floors. That build goes to .next-prodcheck (tests/helpers/production-build.ts).
const ROOT = path.resolve(__dirname, '../..');
const DOORS = ['/api/test/clock/route', '/api/payments/test-endpoint/route', '/api/bench-floor/loans/route', '/api/bench-floor/scan/[code]/route', '/dev/mailbox/page', '/dev/mailbox/[id]/page'];

function appPaths(dist: string): string[] {
  return Object.keys(JSON.parse(readFileSync(path.join(ROOT, dist, 'server/app-paths-manifest.json'), 'utf8')));
}

describe('doors by build', () => {
  it('the test build has the test hooks and the dev mailbox, not the bench floors', () => {
    const paths = appPaths(process.env.OHM_DIST_DIR ?? '.next-test');
    expect(paths).toEqual(expect.arrayContaining(['/api/test/clock/route', '/api/payments/test-endpoint/route', '/dev/mailbox/page']));
    expect(paths).not.toContain('/api/bench-floor/loans/route');
    expect(paths).toContain('/api/loans/route');
  });

  it('the build npm start serves has none of them', { timeout: 600_000 }, () => {
    const paths = appPaths(productionBuild());
    expect(paths).toContain('/api/loans/route');
    expect(paths).toContain('/api/openapi.json/route');
    expect(paths.filter((p) => DOORS.includes(p))).toEqual([]);
  });
});
