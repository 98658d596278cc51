/**
 * No import cycle between files of src/: imports only go downstream (DEVELOPERS.md, Layout),
 * so the graph of every import — type-only ones included, since a cycle of types is still a
 * circle in the design — must have no strongly connected component of more than one file.
 */
import { describe, expect, it } from 'vitest';
import { cycles, importEdges, sourceFiles } from './import-graph.js';

describe('import graph of src/', () => {
  const edges = importEdges();
  const files = sourceFiles();

  it('reads a graph of the whole source tree', () => {
    // every stage folder has files, and the barrels re-export: a reader that missed multi-line
    // or `export … from` statements would find far fewer edges than files
    expect(files.length).toBeGreaterThan(120);
    expect(edges.length).toBeGreaterThan(2 * files.length);
    expect(edges.some((e) => e.from === 'index.ts' && e.kind === 'export' && e.to === 'errors.ts')).toBe(true);
    expect(edges.some((e) => e.from === 'fem/loads.ts' && e.to === 'fem/pin-force.ts' && !e.typeOnly)).toBe(true);
  });

  it('the cycle finder finds a planted cycle (so a pass below means something)', () => {
    const planted = [...edges, { from: 'fem/edge-load.ts', to: 'fem/loads.ts' }];
    const found = cycles(files, planted);
    expect(found).toHaveLength(1);
    expect(found[0]).toEqual(expect.arrayContaining(['fem/edge-load.ts', 'fem/loads.ts']));
  });

  it('has no cycle', () => {
    expect(cycles(files, edges)).toEqual([]);
  });
});
