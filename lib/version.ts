import pkg from '@/package.json';

// The running version, from package.json: shown in Settings and the footer of /api/health, and on
// every log line. Raise it in package.json with each release (README: Upgrading).
export const APP_VERSION: string = pkg.version;
