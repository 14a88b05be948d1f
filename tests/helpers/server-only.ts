// Tests run outside Next's server bundle: `server-only` (which throws when a module reaches a client
// bundle) stands in as an empty module there, so integration tests can call services directly.
export {};
