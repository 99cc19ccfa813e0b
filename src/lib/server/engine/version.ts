/**
 * The engine's version. Raise it with every change that can move a number
 * (a formula, a default, a rounding, a convention); stored results carry it,
 * so `npm run reevaluate` recomputes them and nothing shows figures from an
 * older engine as if they were current. `version.test.ts` holds a fingerprint
 * of the examples' full results for this version and fails when numbers move
 * without a raise.
 */
export const ENGINE_VERSION = '3';
