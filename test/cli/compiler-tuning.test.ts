import { describe, expect, it } from 'vitest';
import { INLINING_FLAG, TUNED_V8_MAJOR, tuneCompiler } from '../../src/cli/compiler-tuning.js';

describe('compiler tuning of the study worker', () => {
  it('is applied on the V8 major it was measured on, and only there', () => {
    expect(INLINING_FLAG).toMatch(/^--max-inlined-bytecode-size-cumulative=\d+$/);
    expect(tuneCompiler({}, `${TUNED_V8_MAJOR}.3.244.8-node.33`)).toBe(true);
    // another major: its defaults and flag names were not measured, so nothing is set
    expect(tuneCompiler({}, '12.4.254.21-node.33')).toBe(false);
  });
  it('is left off with PEAKWISE_COMPILER_TUNING=0', () => {
    expect(tuneCompiler({ PEAKWISE_COMPILER_TUNING: '0' }, `${TUNED_V8_MAJOR}.3.244.8-node.33`)).toBe(false);
  });
});
