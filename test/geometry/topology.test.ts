import { describe, it, expect } from 'vitest';
import {
  buildGeometry,
  curveEnd,
  curvePoint,
  curveStart,
  curveTangent,
  loopPolyline,
  pointInMaterial,
  type PlateGeometry,
} from '../../src/geometry/index.js';
import { L_POINTS, circle, ellipse, plate, poly, rect, rectPoints } from './fixtures.js';

function signedArea(pts: Array<[number, number]>): number {
  let s = 0;
  for (let i = 0; i < pts.length; i++) {
    const a = pts[i];
    const b = pts[(i + 1) % pts.length];
    s += a[0] * b[1] - b[0] * a[1];
  }
  return s / 2;
}

function allShapesPlate(reversed: boolean) {
  const outline = rectPoints(0, 0, 800, 400);
  const tri: Array<[number, number]> = [[600, 50], [620, 50], [610, 80]];
  const r = (p: Array<[number, number]>) => (reversed ? [...p].reverse() : p);
  return plate(
    poly(r(outline), reversed ? { 0: 10 } : { 3: 10 }),
    rect(400, 200, 300, 150, 25),
    circle(100, 100, 20),
    ellipse(650, 300, 40, 12, 30),
    poly(r(tri)),
  );
}

function checkJunctionsExact(g: PlateGeometry): void {
  for (const loop of g.loops) {
    for (let k = 0; k < loop.pieces.length; k++) {
      const a = g.pieces[loop.pieces[k]].curve;
      const b = g.pieces[loop.pieces[(k + 1) % loop.pieces.length]].curve;
      const end = curveEnd(a);
      const start = curveStart(b);
      // bitwise the same numbers, not merely close
      expect(Object.is(end[0], start[0]) && Object.is(end[1], start[1])).toBe(true);
      expect(curvePoint(a, 1)).toEqual(end);
      expect(curvePoint(b, 0)).toEqual(start);
    }
  }
}

describe('orientation: material on the left of travel', () => {
  for (const reversed of [false, true]) {
    it(`outline counter-clockwise, openings clockwise (input ${reversed ? 'clockwise' : 'counter-clockwise'})`, () => {
      const g = buildGeometry(allShapesPlate(reversed));
      for (const loop of g.loops) {
        const a = signedArea(loopPolyline(g, loop.id, 1));
        if (loop.hole) expect(a).toBeLessThan(0);
        else expect(a).toBeGreaterThan(0);
      }
      // the point just left of every piece's middle is material, just right of it is not
      const h = 1e-6 * g.scale;
      for (const p of g.pieces) {
        const m = curvePoint(p.curve, 0.5);
        const t = curveTangent(p.curve, 0.5);
        expect(pointInMaterial(g, [m[0] - h * t[1], m[1] + h * t[0]])).toBe(true);
        expect(pointInMaterial(g, [m[0] + h * t[1], m[1] - h * t[0]])).toBe(false);
      }
    });
  }

  it('both input orientations give the same area; edge plate.outline[k] joins input vertices k and k+1', () => {
    const a = buildGeometry(allShapesPlate(false));
    const b = buildGeometry(allShapesPlate(true));
    expect(Math.abs(a.area - b.area)).toBeLessThan(1e-12 * a.area);
    const cw: Array<[number, number]> = [[0, 0], [0, 30], [20, 50], [70, 10], [60, 0]]; // clockwise
    const g = buildGeometry(plate(poly(cw)));
    for (const p of g.pieces) {
      const k = Number(/\[(\d+)\]$/.exec(p.keyPath)![1]);
      const ends = [curveStart(p.curve), curveEnd(p.curve)].map((q) => q.join(',')).sort();
      expect(ends).toEqual([cw[k], cw[(k + 1) % cw.length]].map((q) => q.join(',')).sort());
    }
  });
});

describe('junctions and tags', () => {
  it('consecutive pieces share end points exactly', () => {
    checkJunctionsExact(buildGeometry(allShapesPlate(false)));
    checkJunctionsExact(buildGeometry(allShapesPlate(true)));
    checkJunctionsExact(buildGeometry(plate(rect(0, 0, 40, 140, 20))));
    checkJunctionsExact(buildGeometry(plate(poly(L_POINTS, { 0: 5, 1: 8, 2: 3, 3: 12, 4: 6, 5: 9 }))));
  });

  it('pieces carry loop ids, roles, radii and key paths', () => {
    const g = buildGeometry(allShapesPlate(false));
    const byLoop = (id: string) => g.pieces.filter((p) => p.loop === id);
    expect(byLoop('outline').map((p) => p.keyPath)).toEqual([
      'plate.outline[0]', 'plate.outline[1]', 'plate.outline[2]', 'plate.outline[3]', 'plate.outline[3]',
    ]);
    expect(byLoop('outline').map((p) => p.role)).toEqual(['edge', 'edge', 'edge', 'fillet', 'edge']);
    const pin = byLoop('h1');
    expect(pin.length).toBe(2); // a circle is two half arcs
    expect(pin.every((p) => p.role === 'circle' && p.radius === 20 && p.keyPath === 'plate.openings[1]')).toBe(true);
    const ell = byLoop('h2');
    // smallest radius of curvature of an ellipse, b²/a at the ends of the major axis (standard result)
    expect(ell.every((p) => p.role === 'ellipse' && Math.abs(p.radius - (12 * 12) / 40) < 1e-12)).toBe(true);
    const door = byLoop('h0');
    expect(door.filter((p) => p.role === 'fillet').length).toBe(4);
    expect(door.filter((p) => p.role === 'edge').length).toBe(4);
    expect(g.loops.map((l) => [l.id, l.hole, l.keyPath])).toEqual([
      ['outline', false, 'plate.outline'],
      ['h0', true, 'plate.openings[0]'],
      ['h1', true, 'plate.openings[1]'],
      ['h2', true, 'plate.openings[2]'],
      ['h3', true, 'plate.openings[3]'],
    ]);
    g.pieces.forEach((p, i) => expect(p.id).toBe(i));
  });

  it('one-shape outline pieces are tagged plate.outline', () => {
    const g = buildGeometry(plate(rect(0, 0, 100, 50, 5)));
    expect(new Set(g.pieces.map((p) => p.keyPath))).toEqual(new Set(['plate.outline']));
  });
});

describe('corners and their material angles', () => {
  const angles = (g: PlateGeometry, loop?: string) =>
    g.corners.filter((c) => loop === undefined || c.loop === loop).map((c) => Math.round(c.interiorAngleDeg * 1e9) / 1e9).sort((a, b) => a - b);

  it('rectangle: four corners of 90°', () => {
    for (const pts of [rectPoints(0, 0, 3, 2), rectPoints(0, 0, 3, 2).reverse()]) {
      expect(angles(buildGeometry(plate(poly(pts))))).toEqual([90, 90, 90, 90]);
    }
  });

  it('L-bracket: five of 90° and the re-entrant corner of 270° at plate.outline[3]', () => {
    const g = buildGeometry(plate(poly(L_POINTS)));
    expect(angles(g)).toEqual([90, 90, 90, 90, 90, 270]);
    const re = g.corners.find((c) => c.interiorAngleDeg > 180)!;
    expect(re.keyPath).toBe('plate.outline[3]');
    expect(re.at).toEqual([40, 40]);
    expect(g.pieces[re.pieceIn].curve).toMatchObject({ kind: 'line', to: [40, 40] });
    expect(g.pieces[re.pieceOut].curve).toMatchObject({ kind: 'line', from: [40, 40] });
  });

  it('L-bracket with the re-entrant corner filleted: the tangent junctions are not corners', () => {
    const g = buildGeometry(plate(poly(L_POINTS, { 3: 10 })));
    expect(angles(g)).toEqual([90, 90, 90, 90, 90]);
  });

  it('V-notch in an edge: tip angle 360° − notch opening, and the polygon angle sum holds', () => {
    // notch 2·10 wide at the mouth and 30 deep: opening angle 2·atan(10/30)
    const pts: Array<[number, number]> = [[0, 0], [100, 0], [100, 50], [60, 50], [50, 20], [40, 50], [0, 50]];
    const g = buildGeometry(plate(poly(pts)));
    const tip = g.corners.find((c) => c.keyPath === 'plate.outline[4]')!;
    expect(Math.abs(tip.interiorAngleDeg - (360 - (2 * Math.atan(10 / 30) * 180) / Math.PI))).toBeLessThan(1e-10);
    // interior angles of a simple n-gon sum to (n − 2)·180° (Euclid, Elements I.32)
    const sum = g.corners.reduce((s, c) => s + c.interiorAngleDeg, 0);
    expect(Math.abs(sum - (pts.length - 2) * 180)).toBeLessThan(1e-9);
  });

  it('square hole: four material angles of 270°; circles and rounded rectangles have no corners', () => {
    const g = buildGeometry(plate(poly(rectPoints(0, 0, 100, 100)), poly(rectPoints(40, 40, 20, 20)), circle(20, 20, 5), rect(75, 75, 20, 10, 3)));
    expect(angles(g, 'h0')).toEqual([270, 270, 270, 270]);
    expect(g.corners.filter((c) => c.loop === 'h0').map((c) => c.keyPath).sort()).toEqual([
      'plate.openings[0].polygon[0]', 'plate.openings[0].polygon[1]', 'plate.openings[0].polygon[2]', 'plate.openings[0].polygon[3]',
    ]);
    expect(angles(g, 'h1')).toEqual([]);
    expect(angles(g, 'h2')).toEqual([]);
    const sharpRect = buildGeometry(plate(poly(rectPoints(0, 0, 100, 100)), rect(50, 50, 20, 10)));
    expect(angles(sharpRect, 'h0')).toEqual([270, 270, 270, 270]);
  });

  it('a collinear vertex is not a corner', () => {
    const g = buildGeometry(plate(poly([[0, 0], [50, 0], [100, 0], [100, 10], [0, 10]])));
    expect(angles(g)).toEqual([90, 90, 90, 90]);
    expect(g.pieces.length).toBe(5);
  });
});

describe('inside and outside near curved boundaries', () => {
  it('points a hair either side of a fillet arc, a circle and an ellipse are classified exactly', () => {
    // the winding number adds each arc chord's segment back, so there is no chord error even
    // 1e-9 from the curve, where a 64-chord polyline would be wrong by ~1e-3 of the radius
    const g = buildGeometry(plate(poly(rectPoints(0, 0, 100, 100), { 2: 40 }), circle(30, 30, 10), ellipse(30, 70, 15, 5, 30)));
    for (const p of g.pieces.filter((q) => q.curve.kind !== 'line')) {
      for (const t of [0.13, 0.5, 0.77]) {
        const m = curvePoint(p.curve, t);
        const tan = curveTangent(p.curve, t);
        const h = 1e-9 * 100;
        expect(pointInMaterial(g, [m[0] - h * tan[1], m[1] + h * tan[0]])).toBe(true);
        expect(pointInMaterial(g, [m[0] + h * tan[1], m[1] - h * tan[0]])).toBe(false);
      }
    }
  });

  it('a hole in the corner cut away by a fillet lies outside the outline', () => {
    // fillet r = 40 at (100, 100): centre (60, 60), the arc passes (88.28, 88.28); (95, 95) is beyond it
    expect(() => buildGeometry(plate(poly(rectPoints(0, 0, 100, 100), { 2: 40 }), circle(95, 95, 1)))).toThrow(/lies outside the outline/);
    expect(() => buildGeometry(plate(poly(rectPoints(0, 0, 100, 100), { 2: 40 }), circle(86, 86, 1)))).not.toThrow();
  });
});

describe('invariance', () => {
  // a filleted L-bracket with a circle, an ellipse and a triangular hole
  const build = (s: number, deg: number, dx: number, dy: number) => {
    const th = (deg * Math.PI) / 180;
    const tr = (p: readonly [number, number]): [number, number] => [
      s * (Math.cos(th) * p[0] - Math.sin(th) * p[1]) + dx,
      s * (Math.sin(th) * p[0] + Math.cos(th) * p[1]) + dy,
    ];
    const c1 = tr([20, 20]);
    const c2 = tr([20, 75]);
    return buildGeometry(
      plate(
        poly(L_POINTS.map(tr), { 1: 8 * s, 3: 10 * s }),
        circle(c1[0], c1[1], 8 * s),
        ellipse(c2[0], c2[1], 12 * s, 4 * s, 60 + deg),
        poly([tr([70, 10]), tr([90, 10]), tr([80, 30])]),
      ),
    );
  };
  const ref = build(1, 0, 0, 0);

  it('scaling by 1e-6 … 1e6 scales the area by s² and keeps corners and piece counts', () => {
    for (const s of [1e-6, 1e-3, 1e3, 1e6]) {
      const g = build(s, 0, 0, 0);
      expect(Math.abs(g.area / (s * s) / ref.area - 1)).toBeLessThan(1e-13);
      expect(g.pieces.length).toBe(ref.pieces.length);
      expect(g.corners.map((c) => c.interiorAngleDeg)).toEqual(ref.corners.map((c) => expect.closeTo(c.interiorAngleDeg, 9)));
    }
  });

  it('rotating and moving the plate keeps area, corners and tags', () => {
    for (const [deg, dx, dy] of [[90, 0, 0], [180, 1e4, -3e3], [270, 5, 5], [33.3, -700, 12]] as const) {
      const g = build(1, deg, dx, dy);
      expect(Math.abs(g.area / ref.area - 1)).toBeLessThan(1e-12);
      expect(g.pieces.map((p) => `${p.loop}:${p.role}:${p.keyPath}`)).toEqual(ref.pieces.map((p) => `${p.loop}:${p.role}:${p.keyPath}`));
      expect(g.corners.map((c) => c.keyPath)).toEqual(ref.corners.map((c) => c.keyPath));
      g.corners.forEach((c, i) => expect(c.interiorAngleDeg).toBeCloseTo(ref.corners[i].interiorAngleDeg, 9));
    }
  });
});
