import { describe, expect, it } from 'vitest';
import { buildGeometry } from '../../src/geometry/index.js';
import { meshPlate, sizeFieldFromSettings } from '../../src/mesh/index.js';
import { parseModel } from '../../src/model/index.js';

/*
 * Imported outlines (issue 9). The same plate as a CSV of points and as an SVG path must give
 * the same mesh area (1e-6 relative; polygonal, so both meshes fill the same polygon exactly up
 * to round-off), and SVG arcs must stay exact circles: the plate area with a two-arc hole equals
 * the polygon's shoelace area minus πr² (Green's theorem, exact to round-off).
 */
// bracket plate 200 × 100 with a 40 × 30 notch, model coordinates
const csv = 'x,y\n0,0\n200,0\n200,100\n120,100\n120,70\n80,70\n80,100\n0,100\n';
// the same in SVG coordinates (y down: y_svg = −y), mixing absolute and relative commands
const svg = `<?xml version="1.0"?>
<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 -100 200 100">
  <path id="frame" d="M0 0 H200 v-100 L120-100 l0 30 h-40 V-100 H0 Z" fill="none"/>
  <path id="hole" d="M 50,-40 A 10 10 0 0 0 30,-40 A 10 10 0 1 0 50 -40 z"/>
  <path id="bowtie" d="M0 0 L200 -100 L200 0 L0 -60 Z"/>
</svg>`;
const files: Record<string, string> = { 'frame.csv': csv, 'frame.svg': svg, 'bad.csv': 'x,z\n0,0\n1,0\n0,1\n' };
const readFile = (p: string): string => {
  if (!(p in files)) throw new Error(`ENOENT: no such file or directory, open '${p}'`);
  return files[p];
};

const model = (outline: string, openings = '[]') => parseModel(`
material: { E: 210000, nu: 0.3 }
thickness: 8
plate: { outline: ${outline}, openings: ${openings} }
supports: [ { where: { y: 0 }, fix: [x, y] } ]
loads: [ { where: { x: 200 }, traction: [10, 0] } ]
mesh: { size: 12, order: 1 }
`, 'bracket.yaml', { readFile });

function meshArea(outline: string): number {
  const m = model(outline);
  const g = buildGeometry(m.plate);
  const mesh = meshPlate(g, { sizeAt: sizeFieldFromSettings(g, m.mesh), order: 1 });
  let area = 0;
  for (let e = 0; e < mesh.elemNodes.length / 3; e++) {
    const [a, b, c] = [0, 1, 2].map((k) => mesh.elemNodes[3 * e + k]);
    area += 0.5 * ((mesh.xy[2 * b] - mesh.xy[2 * a]) * (mesh.xy[2 * c + 1] - mesh.xy[2 * a + 1])
      - (mesh.xy[2 * c] - mesh.xy[2 * a]) * (mesh.xy[2 * b + 1] - mesh.xy[2 * a + 1]));
  }
  return area;
}

describe('imported outlines', () => {
  it('CSV and SVG outlines of the same plate give the same mesh area (1e-6 relative)', () => {
    const fromCsv = meshArea('{ points: frame.csv }');
    const fromSvg = meshArea('{ svg: frame.svg, path: frame }');
    const exact = 200 * 100 - 40 * 30; // shoelace of the bracket
    expect(Math.abs(fromSvg / fromCsv - 1)).toBeLessThan(1e-6);
    expect(Math.abs(fromCsv / exact - 1)).toBeLessThan(1e-9);
  });

  it('an SVG hole drawn with two arcs stays an exact circle (area by Green’s theorem)', () => {
    const g = buildGeometry(model('{ points: frame.csv }', '[ { id: vent, svg: frame.svg, path: hole } ]').plate);
    const hole = g.pieces.filter((p) => p.loop === 'vent');
    expect(hole.every((p) => p.curve.kind === 'arc')).toBe(true);
    expect(Math.abs(g.area - (200 * 100 - 40 * 30 - Math.PI * 100)) / g.area).toBeLessThan(1e-12);
  });

  it('scale and units convert drawing units to the model length unit', () => {
    const m = model('{ svg: frame.svg, path: frame, units: cm }');
    const g = buildGeometry(m.plate);
    expect(g.bbox.maxX - g.bbox.minX).toBeCloseTo(2000, 9); // 200 cm = 2000 mm
  });

  it('bad files give errors naming the file', () => {
    expect(() => model('{ points: bad.csv }')).toThrow(/bad\.csv: missing column 'y'/);
    expect(() => model('{ svg: frame.svg, path: frame2 }')).toThrow(/frame\.svg: no <path> with id 'frame2'.*'frame'/);
    expect(() => model('{ points: nowhere.csv }')).toThrow(/nowhere\.csv: cannot read the file/);
    expect(() => buildGeometry(model('{ svg: frame.svg, path: bowtie }').plate)).toThrow(/frame\.svg#bowtie.*crosses or touches itself/);
    files['tie.csv'] = 'x,y\n0,0\n200,100\n200,0\n0,100\n';
    expect(() => buildGeometry(model('{ points: tie.csv }').plate)).toThrow(/tie\.csv.*crosses itself/);
  });
});
