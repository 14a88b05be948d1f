import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';

// A build made the way a real space's is (no OHM_BUILD_DOORS), in .next-prodcheck, reused while the
// sources match (the same fingerprint scripts/lib.sh's build_app_if_changed writes). Shared by the
// build-doors test and the production-start test; a lock file keeps two builders apart.
const ROOT = path.resolve(__dirname, '../..');
export const PRODUCTION_DIST = '.next-prodcheck';

export function productionBuild(): string {
  const dist = PRODUCTION_DIST;
  const fingerprint = execFileSync('bash', ['-c', 'git ls-files -co --exclude-standard -z | xargs -0 md5sum 2>/dev/null | md5sum | cut -c1-32'], {
    cwd: ROOT,
    encoding: 'utf8',
  }).trim();
  const stamp = path.join(ROOT, dist, 'ohm-source.stamp');
  if (existsSync(stamp) && readFileSync(stamp, 'utf8').trim() === fingerprint) return dist;
  const env = { ...process.env, OHM_DIST_DIR: dist, NODE_ENV: 'production' } as Record<string, string | undefined>;
  delete env.OHM_BUILD_DOORS;
  delete env.OHM_TEST_HOOKS;
  execFileSync(
    'flock',
    [path.join(ROOT, '.prodcheck-build.lock'), 'bash', '-c', `[ "$(cat ${stamp} 2>/dev/null)" = ${fingerprint} ] || { node node_modules/next/dist/bin/next build && echo ${fingerprint} > ${stamp}; }`],
    { cwd: ROOT, env: env as NodeJS.ProcessEnv, stdio: 'pipe', maxBuffer: 64 * 1024 * 1024 },
  );
  return dist;
}
