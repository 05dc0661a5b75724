// Pliant's version, recorded in every seed file, manifest and report. Kept with the scenario
// (environment-free, below every room that records it) so no room need know the command line.
// Keep in step with package.json (test/version.test.ts checks that they agree).
export const PLIANT_VERSION = '0.1.0';
