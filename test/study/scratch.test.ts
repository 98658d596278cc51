import { it } from 'vitest';
import { parseModel } from '../../src/model/index.js';
import { runStudy } from '../../src/study/index.js';
const head = `
units: { length: mm, force: N }
material: { E: 200000, nu: 0.3 }
thickness: 1
state: plane-stress
`;
it('x', () => {
  const r = runStudy(parseModel(head + process.env.M!, 't.yaml'), { levels: Number(process.env.LV ?? 4) });
  console.log(r.timings);
  for (const s of r.spots) console.log(JSON.stringify({ id: s.id, at: s.at, f: s.feature.description, v: s.verdict, reason: s.reason, est: s.estimate, g: s.growth, lv: s.levels.map((l) => [l.h, l.dofs, l.peak.toFixed(5), l.peakAt.map((v) => v.toFixed(3)).join(',')]) }));
});
