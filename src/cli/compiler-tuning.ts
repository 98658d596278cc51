/**
 * One setting of V8's optimising compiler for the study and solve worker: a smaller inlining budget.
 *
 * A study of a demo plate is a short process in which most functions run for the first time, so
 * the optimising compiler's own time counts: on this project's 2-core machine about a third of a
 * cold study's CPU is compilation on the background threads, and code waits in the slower tiers
 * until its optimised version is ready. Inlining less (a cumulative budget of 200 bytes of bytecode
 * per optimised function instead of V8's 920; small functions are still inlined whatever the
 * budget) makes each compilation cheaper and the optimised code arrive sooner. Measured on Node 20
 * (V8 11.3), nine interleaved runs each (docs/speed.md, "Compiler settings"): the l-bracket-sharp
 * study 1.59 → 1.44 s wall and 2.53 → 2.17 s CPU, web-opening 1.40 → 1.35 s and 2.22 → 2.01 s; a
 * 454k-dof solve 5.1 → 5.0 s (its factor 4–16 % slower, its ordering 8–15 % faster). Results do not
 * change: inlining changes no arithmetic (ECMAScript fixes every operation's rounding).
 *
 * Set through `v8.setFlagsFromString` in the main thread before the worker starts, so every
 * compilation of the worker sees it; only on the V8 major version it was measured on (an unknown
 * flag would print V8's complaint). `PEAKWISE_COMPILER_TUNING=0` leaves V8's defaults.
 */
import { setFlagsFromString } from 'node:v8';

/** The flag, and the V8 major version whose defaults and timing it was chosen on. */
export const INLINING_FLAG = '--max-inlined-bytecode-size-cumulative=200';
export const TUNED_V8_MAJOR = '11';

/** Apply the inlining budget for this process (before any worker starts); true when applied. */
export function tuneCompiler(env: NodeJS.ProcessEnv = process.env, v8Version: string = process.versions.v8): boolean {
  if (env.PEAKWISE_COMPILER_TUNING === '0' || v8Version.split('.')[0] !== TUNED_V8_MAJOR) return false;
  setFlagsFromString(INLINING_FLAG);
  return true;
}
