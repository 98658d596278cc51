/**
 * study.json's `advice` follows what makes a site singular, the same words as the terminal and the
 * HTML report: at the end of a clamped edge the next step is the real support, not a corner radius.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseModel } from '../../src/model/index.js';
import { runStudy, siteAdvice } from '../../src/study/index.js';

describe('advice in the study result', () => {
  it('a singular site where a support ends advises the real support; every site carries the report\u2019s words', () => {
    const file = new URL('../../models/l-bracket-sharp.yaml', import.meta.url);
    const study = runStudy(parseModel(readFileSync(file, 'utf8'), 'l-bracket-sharp.yaml'), { levels: 4 });
    const ends = study.sites.filter((s) => s.verdict === 'singular' && (s.feature.kind === 'support-edge' ||
      (s.feature.kind === 'corner' && (s.feature.faceConditions ?? []).some((c) => c !== 'free'))));
    expect(ends.length).toBeGreaterThan(0);
    for (const s of ends) {
      expect(s.advice).toMatch(/model the real support/);
      expect(s.advice).not.toMatch(/real radius|corner radius/);
    }
    for (const s of study.sites) expect(s.advice).toBe(siteAdvice(s));
  });
});
