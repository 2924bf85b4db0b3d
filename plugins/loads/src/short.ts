/**
 * `short`: an ideal zero-volt branch, solved exactly as a constraint by the engine.
 */
import { defineLoad } from '@skein/core';

/**
 * The short-circuit load plugin. No parameters.
 * @example create({}).kind // 'short'
 */
export const shortLoad = defineLoad({
  type: 'short',
  summary: 'An ideal short circuit (zero volts, any current)',
  params: {},
  create() {
    return { kind: 'short' };
  },
});
