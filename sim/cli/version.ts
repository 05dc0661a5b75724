// Pliant's version, recorded in every seed file and manifest. Keep in step with package.json
// (a test checks that they agree).
export const PLIANT_VERSION = '0.1.0';
