// The caution the shells show at start-up and hand to the page, in the project's one wording.
// The shells themselves never import sim/ (test/electron-shells-share-services.test.ts), so the
// wording reaches them through this module.
export { SAFETY_CAUTION as SAFETY_NOTICE } from '../sim/scenario/safety-caution.ts';
