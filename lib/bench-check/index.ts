// Request-side services of the public bench check: parse strictly, compute, never answer 500.
export { benchCheck, benchCompare, extremeInputs } from './service';
export type { BenchCheckAnswer, CompareAnswer, CompareRow } from './service';
export { compareBodySchema, MIN_COMPARE_AMPS, MAX_COMPARE_AMPS } from './schemas';
export { issueFields, parseBenchBody, readJson } from './parse';
export { firstNonFinite } from './finite';
