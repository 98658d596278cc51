/**
 * The study report: one self-contained HTML page (inline CSS and SVG, no scripts, no external
 * requests) that reads on screen and prints to A4 or letter. All model text is escaped.
 */
import type { PlateGeometry } from '../geometry/types.js';
import { mirroredSection } from './mirror.js';
import type { Mesh } from '../mesh/types.js';
import type { Model, Shape } from '../model/types.js';
import type { SiteResult, StudyResult } from '../study/types.js';
import { contourSvg } from './contour.js';
import { plotCss } from './css.js';
import { convergencePlotSvg, cutPlotSvg, type CutPlotInput } from './plot.js';
import { reportedSectionHtml } from './other-analysis.js';
import { escapeXml, formatFixed, formatNumber, safeId } from './text.js';
import { singularMaxWarning } from './singular-max.js';
import {
  BAND_LABEL, CAUTION, READOUTS_LEGEND, SITE_DETECTION, aboveYieldNote, bandText, capitalise, describeLoad, describeSupport,
  featureLabel, materialLine, nsifText, siteAdvice, siteReadout, siteValue, siteWhere,
} from './words.js';

export interface ReportCheck {
  name: string;
  pass: boolean;
  /** optional one-line detail, e.g. "Kt 3.003 vs 3 (Kirsch 1898)" */
  detail?: string;
  /** what the reference value is: a published result, or an independent FE computation of our own */
  referenceKind?: 'published' | 'independent-fe';
  /** set when the result is a recorded run (docs/verification.json), not one made for this report */
  recorded?: { date: string; version: string };
}

/** What the report shows of a run: a study's result, or one solve's figures with `sites: []`. */
export type ReportRun = Pick<StudyResult, 'version' | 'model' | 'units' | 'mesh' | 'solution' | 'measure' | 'sites' | 'warnings' | 'yieldStress' | 'cases' | 'envelope' | 'reported'>;

export interface ReportInput {
  model: Model;
  study: ReportRun;
  /** the mesh the field lives on (e.g. the finest study mesh or the base solve) */
  mesh: Mesh;
  geometry: PlateGeometry;
  /** study measure, one value per node of `mesh` */
  field: Float64Array;
  /** displacements, 2 per node of `mesh` */
  u: Float64Array;
  checks?: ReportCheck[];
  /** stresses along a --cut (with closed-form references when compared), drawn in their own section */
  cut?: CutPlotInput;
  /**
   * 'study' (default): the full page with verdicts and site sections. 'solve': one solve, no
   * refinement study — the verdict and site sections are replaced by a pointer to `peakwise
   * study`; pass the solve's figures with `sites: []`.
   */
  mode?: 'study' | 'solve';
  /** magnification of the deformed outline (default: a round number that makes the largest displacement about 6 % of the plate size) */
  deformationScale?: number;
}

const MEASURE_NAMES: Record<string, string> = {
  'von-mises': 'von Mises stress',
  'max-principal': 'maximum principal stress',
  tresca: 'Tresca stress',
  sxx: 'σxx',
  syy: 'σyy',
  sxy: 'τxy',
};

export function measureName(measure: string): string {
  return MEASURE_NAMES[measure] ?? measure;
}

/** Largest round number (1, 2 or 5 × 10^k) not above `raw`. */
export function roundDown125(raw: number): number {
  if (!(raw > 0) || !Number.isFinite(raw)) return 1;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const m = raw / mag;
  return (m >= 5 ? 5 : m >= 2 ? 2 : 1) * mag;
}

export function autoDeformationScale(u: Float64Array, plateSize: number): number | undefined {
  let maxU = 0;
  for (let n = 0; n < u.length / 2; n++) maxU = Math.max(maxU, Math.hypot(u[2 * n], u[2 * n + 1]));
  if (!(maxU > 0) || !(plateSize > 0)) return undefined;
  return roundDown125((0.06 * plateSize) / maxU);
}

function shapeWords(shape: Shape, L: string): string {
  const n = (v: number) => formatNumber(v);
  switch (shape.kind) {
    case 'circle':
      return `circle, radius ${n(shape.radius)} ${L}, centre (${n(shape.center[0])}, ${n(shape.center[1])})`;
    case 'ellipse':
      return `ellipse, semi-axes ${n(shape.a)} × ${n(shape.b)} ${L} turned ${n(shape.angleDeg)}°, centre (${n(shape.center[0])}, ${n(shape.center[1])})`;
    case 'rect':
      return `rectangle ${n(shape.width)} × ${n(shape.height)} ${L}${shape.round > 0 ? `, corners rounded r ${n(shape.round)}` : ', sharp corners'}, centre (${n(shape.center[0])}, ${n(shape.center[1])})`;
    case 'polygon': {
      const rounded = shape.vertices.filter((v) => v.round > 0).length;
      return `polygon of ${shape.vertices.length} vertices${rounded > 0 ? `, ${rounded} rounded` : ''}`;
    }
  }
}

interface MeshStats {
  nodes: number;
  vertices: number;
  elements: number;
  minEdge: number;
  maxEdge: number;
  boundaryEdges: number;
}

function meshStats(mesh: Mesh): MeshStats {
  const en = mesh.elemNodes, npe = mesh.nodesPerElem, xy = mesh.xy;
  const nElems = Math.floor(en.length / npe);
  let minEdge = Infinity, maxEdge = 0;
  for (let e = 0; e < nElems; e++) {
    for (let i = 0; i < 3; i++) {
      const a = en[npe * e + i], b = en[npe * e + ((i + 1) % 3)];
      const d = Math.hypot(xy[2 * b] - xy[2 * a], xy[2 * b + 1] - xy[2 * a + 1]);
      if (d < minEdge) minEdge = d;
      if (d > maxEdge) maxEdge = d;
    }
  }
  return {
    nodes: xy.length / 2,
    vertices: mesh.nVertices,
    elements: nElems,
    minEdge: Number.isFinite(minEdge) ? minEdge : 0,
    maxEdge,
    boundaryEdges: Math.floor(mesh.boundaryEdges.length / mesh.edgeStride),
  };
}

const int = (n: number) => Math.round(n).toLocaleString('en-US');

function row(label: string, value: string): string {
  return `<tr><th scope="row">${escapeXml(label)}</th><td>${value}</td></tr>`;
}

function verdictBadge(verdict: string): string {
  return `<span class="verdict verdict-${safeId(verdict)}">${escapeXml(verdict)}</span>`;
}

/** Section ids for sites: `site-<id>`, made unique when cleaned ids collide. */
export function siteSectionIds(sites: SiteResult[]): string[] {
  const used = new Set<string>();
  return sites.map((s, i) => {
    let id = `site-${safeId(s.id)}`;
    if (used.has(id)) id = `${id}-${i + 1}`;
    used.add(id);
    return id;
  });
}

/** What every section of the page needs, worked out once. */
interface PageContext {
  input: ReportInput;
  model: Model;
  study: ReportRun;
  units: StudyResult['units'];
  /** length and stress unit */
  L: string;
  S: string;
  /** the study measure in words */
  measure: string;
  sectionIds: string[];
  solveOnly: boolean;
}

function pageContext(input: ReportInput): PageContext {
  const units = input.study.units;
  return {
    input,
    model: input.model,
    study: input.study,
    units,
    L: units.length,
    S: units.stress,
    measure: measureName(input.study.measure),
    sectionIds: siteSectionIds(input.study.sites),
    solveOnly: input.mode === 'solve',
  };
}

/** A solve page whose maximum sits at a point theory flags as singular says so (as `peakwise solve` does). */
function solveMaxWarning(ctx: PageContext): string | undefined {
  const { mesh, geometry, field } = ctx.input;
  let node = -1;
  for (let n = 0; n < field.length; n++) if (Number.isFinite(field[n]) && (node < 0 || field[n] > field[node])) node = n;
  if (node < 0) return undefined;
  return singularMaxWarning({ model: ctx.model, geometry, mesh, at: [mesh.xy[2 * node], mesh.xy[2 * node + 1]], measure: ctx.measure });
}

function pageHeader(ctx: PageContext, title: string): string {
  const { study, measure, S, solveOnly } = ctx;
  const counts = (['converging', 'singular', 'undecided'] as const)
    .map((v) => `${study.sites.filter((s) => s.verdict === v).length} ${v}`)
    .join(', ');
  const lede = solveOnly
    ? `One solve; measure: ${measure} in ${S}.`
    : `${study.sites.length} site${study.sites.length === 1 ? '' : 's'} (${counts}); measure: ${measure} in ${S}.`;
  const singular = solveOnly ? solveMaxWarning(ctx) : undefined;
  const warnings = [...(study.warnings ?? []), ...(singular ? [singular] : [])];
  return `<header>
<p class="tool">peakwise ${escapeXml(study.version)} · ${solveOnly ? 'single solve' : 'convergence study'}</p>
<h1>${title}</h1>
<p class="lede">${escapeXml(lede)}</p>
${solveOnly ? '' : `<p class="detection">${escapeXml(SITE_DETECTION)}</p>\n`}<p class="caution" role="note">${escapeXml(CAUTION)}</p>
${warnings.length > 0 ? `<ul class="warnings">${warnings.map((w) => `<li>Warning: ${escapeXml(w)}</li>`).join('')}</ul>` : ''}
</header>`;
}

function modelSection(ctx: PageContext): string {
  const { model, units, L, S, measure } = ctx;
  const rows = [
    row('Title', escapeXml(model.title)),
    row('Model file', model.file ? `<code>${escapeXml(model.file)}</code>` : '(built in code)'),
    row('Units', `length ${escapeXml(units.length)}, force ${escapeXml(units.force)}, stress ${escapeXml(units.stress)}`),
    row('Material', escapeXml(materialLine(model, S))),
    model.state === 'axisymmetric'
      ? row('Section', 'axisymmetric: the meridian section of a body of revolution, drawn in (r, z) = (x, y) about the axis r = 0, whose nodes are held radially by the section itself; no thickness (forces are for the whole revolution)')
      : row('Thickness', `${escapeXml(formatNumber(model.thickness))} ${escapeXml(L)}`),
    row('State', escapeXml(model.state.replace('-', ' '))),
    row('Outline', escapeXml(capitalise(shapeWords(model.plate.outline, L)))),
    row(
      'Openings',
      model.plate.openings.length === 0
        ? 'none'
        : `<ul>${model.plate.openings.map((o) => `<li><b>${escapeXml(o.id)}</b>: ${escapeXml(shapeWords(o.shape, L))}</li>`).join('')}</ul>`,
    ),
    row('Supports', `<ul>${model.supports.map((s) => `<li>${escapeXml(describeSupport(s, L))}</li>`).join('')}</ul>`),
    ...loadRows(ctx),
    row('Study', escapeXml(`${measure}; ${model.study.levels} levels, element size ÷ ${formatNumber(model.study.ratio)} per level`)),
  ];
  return `<section id="model"><h2>Model</h2><table class="facts">${rows.join('')}</table></section>`;
}

/** The Loads row, or with load cases one row per case and one for the combinations. */
function loadRows(ctx: PageContext): string[] {
  const { model, units } = ctx;
  const list = (loads: Model['loads']) => `<ul>${loads.map((l) => `<li>${escapeXml(describeLoad(l, units))}</li>`).join('')}</ul>`;
  if (!model.cases || model.cases.length === 0) return [row('Loads', list(model.loads))];
  const rows = model.cases.map((c) => {
    const displaced = c.supports.filter((s) => s.displace).map((s) => `<li>${escapeXml(describeSupport(s, ctx.L))}</li>`).join('');
    return row(`Load case ${c.name}`, c.loads.length > 0 || displaced ? `<ul>${c.loads.map((l) => `<li>${escapeXml(describeLoad(l, units))}</li>`).join('')}${displaced}</ul>` : 'no loads');
  });
  if (model.combinations && model.combinations.length > 0) {
    rows.push(row('Combinations', `<ul>${model.combinations.map((c) => `<li><b>${escapeXml(c.name)}</b> = ${escapeXml(c.expression)}</li>`).join('')}</ul>`));
  }
  return rows;
}

function meshSection(ctx: PageContext): string {
  const { study, L } = ctx;
  const { mesh, geometry } = ctx.input;
  const stats = meshStats(mesh);
  const rows = [
    row('Elements', `${int(stats.elements)} ${mesh.order === 2 ? 'six-node LST' : 'three-node CST'} triangles`),
    row('Nodes', `${int(stats.nodes)} (${int(stats.vertices)} corner nodes)`),
    row('Degrees of freedom', int(2 * stats.nodes)),
    row('Element edges', `${escapeXml(formatNumber(stats.minEdge))} to ${escapeXml(formatNumber(stats.maxEdge))} ${escapeXml(L)}`),
    row('Smallest angle', `${escapeXml(formatNumber(study.mesh.minAngleDeg, 3))}°`),
    row('Boundary', `${int(stats.boundaryEdges)} edges on ${geometry.pieces.length} pieces, ${geometry.loops.length} loop${geometry.loops.length === 1 ? '' : 's'}`),
    row(ctx.model.state === 'axisymmetric' ? 'Section area' : 'Plate area', `${escapeXml(formatNumber(geometry.area, 6))} ${escapeXml(L)}²`),
    row(
      'Base solve',
      `${int(study.solution.dofs)} dofs, largest displacement ${escapeXml(formatNumber(study.solution.maxDisplacement))} ${escapeXml(L)}`,
    ),
  ];
  return `<section id="mesh"><h2>Mesh</h2><table class="facts">${rows.join('')}</table></section>`;
}

function pictureSection(ctx: PageContext): string {
  const { study, L, S, measure } = ctx;
  const { mesh, geometry, field, u } = ctx.input;
  const deformScale = ctx.input.deformationScale ?? autoDeformationScale(u, geometry.scale);
  const main = contourSvg(mesh, field, {
    units: `${measure}, ${S}`,
    title: `${measure} (${S}) over the ${ctx.model.state === 'axisymmetric' ? 'section' : 'plate'}${study.cases?.[0] ? `, load case ${study.cases[0].name}` : ''}`,
    sites: study.sites.map((s) => ({ id: s.id, at: s.at })),
    deformed: deformScale !== undefined ? { u, scale: deformScale } : undefined,
    showMesh: true,
    idPrefix: 'main',
    className: 'contour-main',
    lengthUnit: L,
  });
  // an axisymmetric section: also the section with its image about the axis (a cut along the body's axis)
  const mirrored = ctx.model.state === 'axisymmetric' ? mirroredSection(mesh, field) : undefined;
  const whole = mirrored
    ? `\n<figure class="figure">${contourSvg(mirrored.mesh, mirrored.values, {
      units: `${measure}, ${S}`,
      title: `${measure} (${S}), mirrored about the axis`,
      sites: [],
      showMesh: false,
      idPrefix: 'mirror',
      className: 'contour-mirror',
      lengthUnit: L,
    })}</figure>`
    : '';
  return `<section id="picture"><h2>Stress picture</h2>
<p class="toggle-row"><label for="show-mesh" class="toggle">show element edges</label></p>
<figure class="figure">${main}</figure>${whole}</section>`;
}

/** What each verdict means, under the verdict table. */
const VERDICTS_LEGEND =
  'Converging: the peak settles to a finite value of the linear-elastic model, shown with its discretisation band (the estimated error of the mesh alone, ' +
  'not of the model, the loads or the material); compare it with what the applicable code asks for. ' +
  'Singular: the peak keeps growing like h^−q as elements shrink; it is a property of the idealised model, not a stress, so use the readouts. ' +
  'Undecided: the levels do not yet tell.';

/** The verdict table of some sites; `governs` adds the column naming each site's case (the envelope). */
function verdictTable(ctx: PageContext, sites: readonly SiteResult[], governs: boolean, link: boolean): string {
  const { L, S, units, sectionIds } = ctx;
  const verdictRows = sites
    .map(
      (s, i) =>
        `<tr><td>${link ? `<a href="#${sectionIds[i]}">${escapeXml(s.id)}</a>` : escapeXml(s.id)}</td><td>${escapeXml(siteWhere(s, L))}</td>` +
        `<td>${escapeXml(featureLabel(s))}</td><td>${verdictBadge(s.verdict)}</td>` +
        (governs ? `<td><b>${escapeXml(s.case ?? '')}</b></td>` : '') +
        `<td>${escapeXml(siteValue(s, S))}</td><td>${escapeXml(siteReadout(s, units))}</td></tr>`,
    )
    .join('');
  const cols = governs ? 7 : 6;
  return `<table class="verdicts"><thead><tr><th>site</th><th>${ctx.model.state === 'axisymmetric' ? 'where (r, z)' : 'where'}</th><th>feature</th><th>verdict</th>${governs ? '<th>governs</th>' : ''}<th>value ± ${BAND_LABEL}</th><th>readouts</th></tr></thead><tbody>${verdictRows || `<tr><td colspan="${cols}">No sites were found.</td></tr>`}</tbody></table>`;
}

function verdictsSection(ctx: PageContext): string {
  const { study, sectionIds } = ctx;
  const envelope = study.envelope !== undefined;
  const lead = envelope
    ? `<p class="legend-text">${escapeXml(`The envelope of the load cases and combinations: each site as its governing case or combination gives it (the envelope table below compares them).`)}</p>`
    : '';
  return `<section id="verdicts"><h2>Verdicts</h2>
${lead}${verdictTable(ctx, study.sites, envelope, true)}
<p class="legend-text">${escapeXml(VERDICTS_LEGEND)}</p>
<p class="legend-text">${escapeXml(READOUTS_LEGEND)}</p>
</section>${reportedSectionHtml(study, (id) => sectionIds[Math.max(0, study.sites.findIndex((s) => s.id === id))] ?? '')}${envelope ? `\n${envelopeSection(ctx)}\n${casesSection(ctx)}` : ''}`;
}

/** What the envelope compares, under its table. */
const ENVELOPE_LEGEND =
  'Each cell: the verdict initial (c converging, s singular, u undecided) and the value compared — the converged value of a converging site, ' +
  'the readout at distance of a singular one (a singular peak is not a stress), the finest peak of an undecided one. The largest governs (by magnitude for σxx, σyy, τxy); ' +
  'a value whose finest peak lies on the rim of the site’s neighbourhood (marked ◦) belongs to a neighbouring peak and does not govern. ' +
  'A combination is the factored sum of its cases, superposed on every mesh, not solved again.';

function envelopeSection(ctx: PageContext): string {
  const { study, S, sectionIds } = ctx;
  const cases = study.cases ?? [];
  const head = cases.map((c) => `<th>${escapeXml(c.name)}${c.expression ? `<br/><small>${escapeXml(c.expression)}</small>` : ''}</th>`).join('');
  const rows = (study.envelope ?? []).map((e, i) => {
    const cells = e.values.map((v) => {
      const text = `${v.verdict[0]} ${Number.isFinite(v.value) ? formatNumber(v.value, 4) : '—'}${v.rim ? ' ◦' : ''}`;
      return v.case === e.governing ? `<td class="governs"><b>${escapeXml(text)}</b></td>` : `<td>${escapeXml(text)}</td>`;
    }).join('');
    return `<tr><td><a href="#${sectionIds[i]}">${escapeXml(e.site)}</a></td>${cells}<td><b>${escapeXml(e.governing)}</b> (${escapeXml(e.basis)})</td></tr>`;
  }).join('');
  return `<section id="envelope"><h2>Envelope</h2>
<table class="verdicts envelope"><thead><tr><th>site</th>${head}<th>governs</th></tr></thead><tbody>${rows}</tbody></table>
<p class="legend-text">Values in ${escapeXml(S)}. ${escapeXml(ENVELOPE_LEGEND)}</p>
</section>`;
}

/** Every case and combination on its own: its solve and its verdict table, folded. */
function casesSection(ctx: PageContext): string {
  const { study, L, units } = ctx;
  const parts = (study.cases ?? []).map((c) => {
    const [ax, ay] = c.solution.appliedSum;
    const facts = `${c.kind === 'combination' ? `combination ${c.expression ?? ''}, superposed; ` : ''}applied (${formatNumber(ax)}, ${formatNumber(ay)}) ${units.force}, largest displacement ${formatNumber(c.solution.maxDisplacement)} ${L}`;
    return `<details class="case"><summary>${c.kind === 'combination' ? 'Combination' : 'Load case'} <b>${escapeXml(c.name)}</b></summary>` +
      `<p class="legend-text">${escapeXml(facts)}</p>${verdictTable(ctx, c.sites, false, false)}</details>`;
  }).join('\n');
  return `<section id="cases"><h2>Load cases</h2><p class="legend-text">Every site is studied in every case and combination; <code>peakwise study --case NAME</code> prints one.</p>\n${parts}</section>`;
}

/** The facts table of one site: its value or growth, then every readout with its distance. */
function siteFacts(s: SiteResult, ctx: PageContext): string {
  const { L, S, units, study } = ctx;
  const r = s.readouts;
  const len = (v: number | undefined) => (v !== undefined ? `${formatNumber(v)} ${L}` : 'the readout distance');
  const readouts: string[] = [];
  if (s.verdict === 'converging') {
    readouts.push(row(`Converged value ± ${BAND_LABEL}`, escapeXml(bandText(s.estimate.value, s.estimate.uncertainty, S))));
    if (Number.isFinite(s.estimate.observedOrder)) readouts.push(row('Observed order', escapeXml(formatFixed(s.estimate.observedOrder, 2))));
    const y = aboveYieldNote(s, study.yieldStress, S);
    if (y) readouts.push(row('Yield', `<span class="above-yield">${escapeXml(capitalise(y))}.</span>`));
  } else {
    readouts.push(
      row(
        'Growth under refinement',
        escapeXml(`peak ∝ h^−q, q = ${formatFixed(s.growth.exponent, 2)} ± ${formatNumber(s.growth.exponentUncertainty, 2)}; theory ${formatFixed(s.growth.theory, 2)}`),
      ),
    );
  }
  if (r.atDistance !== undefined) readouts.push(row(`Point: stress at r = ${len(r.distance)} along the inward bisector`, escapeXml(`${formatNumber(r.atDistance, 5)} ${S}`)));
  if (r.lineAverage !== undefined) readouts.push(row(`Line: mean along the bisector over r = 0–${len(r.lineLength)}`, escapeXml(`${formatNumber(r.lineAverage, 5)} ${S}`)));
  if (r.average !== undefined) readouts.push(row(`Area: mean over the disk r ≤ ${len(r.distance)}`, escapeXml(`${formatNumber(r.average, 5)} ${S}`)));
  const k = nsifText(s, units);
  if (k) readouts.push(row('K_I: notch stress intensity of the opening mode (Gross & Mendelson 1972)', escapeXml(k)));
  if (s.verdict === 'singular') {
    readouts.push(row('Note', 'The peak grows without bound as the mesh is refined: do not read it as a stress. The point, line and area measures and K_I above are measures of the linear-elastic field; use the one the applicable code or assessment method asks for, at the distance it prescribes.'));
  }
  return `<table class="facts">${readouts.join('')}</table>`;
}

function levelsTable(s: SiteResult, L: string, S: string): string {
  const levelsRows = s.levels
    .map(
      (l, k) =>
        `<tr><td>${k + 1}</td><td>${escapeXml(formatNumber(l.h))}</td><td>${int(l.dofs)}</td>` +
        `<td>${escapeXml(formatNumber(l.peak, 6))}</td><td>${l.atDistance !== undefined ? escapeXml(formatNumber(l.atDistance, 5)) : '—'}</td></tr>`,
    )
    .join('');
  return `<details open="open"><summary>Refinement levels</summary><table class="levels"><thead><tr><th>level</th><th>h (${escapeXml(L)})</th><th>dofs</th><th>peak (${escapeXml(S)})</th><th>point at r = ${escapeXml(s.readouts.distance !== undefined ? `${formatNumber(s.readouts.distance)} ${L}` : 'd')} (${escapeXml(S)})</th></tr></thead><tbody>${levelsRows}</tbody></table></details>`;
}

/** The close-up contour around one site; the triangle budget is shared among the sites. */
function siteInset(ctx: PageContext, s: SiteResult, i: number): string {
  const { study, L, S, measure } = ctx;
  const { mesh, geometry, field } = ctx.input;
  const insetBudget = Math.max(8_000, Math.min(30_000, Math.floor(120_000 / Math.max(1, study.sites.length))));
  const half = 0.07 * geometry.scale;
  return contourSvg(mesh, field, {
    units: `${measure}, ${S}`,
    title: `Around ${s.id}`,
    sites: [{ id: s.id, at: s.at }],
    viewBox: { minX: s.at[0] - half, maxX: s.at[0] + half, minY: s.at[1] - half, maxY: s.at[1] + half },
    showMesh: true,
    width: 300,
    maxHeight: 300,
    levels: 48,
    maxTriangles: insetBudget,
    maxMeshEdges: 20_000,
    idPrefix: `inset-${i + 1}`,
    className: 'contour-inset',
    lengthUnit: L,
  });
}

function siteSection(ctx: PageContext, s: SiteResult, i: number): string {
  const { L, S, measure, sectionIds } = ctx;
  return (
    `<section class="site" id="${sectionIds[i]}">` +
    `<h3>${escapeXml(s.id)} <span class="where">at ${ctx.model.state === 'axisymmetric' ? '(r, z) = ' : ''}${escapeXml(siteWhere(s, L))}</span> ${verdictBadge(s.verdict)}${s.case !== undefined ? ` <span class="where">governed by ${escapeXml(s.case)}</span>` : ''}</h3>` +
    `<p class="feature">${escapeXml(capitalise(s.feature.description || featureLabel(s)))}</p>` +
    `<p class="why"><b>Why:</b> ${escapeXml(s.reason)}</p>` +
    (siteAdvice(s) ? `<p class="advice"><b>Next step:</b> ${escapeXml(siteAdvice(s) ?? '')}</p>` : '') +
    siteFacts(s, ctx) +
    `<div class="site-figures"><figure class="plot">${convergencePlotSvg(s, { units: S, lengthUnit: L, measure, reported: (ctx.study.reported ?? []).filter((a) => a.site === s.id) })}</figure>` +
    `<figure class="inset">${siteInset(ctx, s, i)}</figure></div>` +
    levelsTable(s, L, S) +
    `</section>`
  );
}

function sitesSection(ctx: PageContext): string {
  return `<section id="sites"><h2>Sites</h2>${ctx.study.sites.map((s, i) => siteSection(ctx, s, i)).join('\n')}</section>`;
}

/** One solve: no verdicts, a pointer to the study instead. */
function solveOnlySection(): string {
  return `<section id="verdicts"><h2>Sites</h2><p>This page shows one solve. It does not say which peaks are real stress concentrations and which are singularities of the idealised model: <code>peakwise study</code> finds the sites (theory features, stress maxima above 1.3 × the median, or listed points), refines each and gives that verdict.</p></section>`;
}

function cutSection(cut: CutPlotInput | undefined): string {
  return cut ? `<section id="cut"><h2>Along the cut</h2>${cutPlotSvg(cut)}</section>` : '';
}

function verificationSection(checks: ReportCheck[]): string {
  const passed = checks.filter((c) => c.pass).length;
  const fe = checks.filter((c) => c.referenceKind === 'independent-fe').length;
  const rec = checks.find((c) => c.recorded)?.recorded;
  const kinds = checks.some((c) => c.referenceKind)
    ? ` — ${checks.length - fe} against published results (closed forms, Williams' eigenvalues, a handbook fit), ${fe} against reference values of an independent FE computation made for this project`
    : '';
  const when = rec
    ? `These are the results recorded on ${escapeXml(rec.date)} with peakwise ${escapeXml(rec.version)} (docs/verification.json), not a run made for this report: ${passed} of ${checks.length} checks passed${escapeXml(kinds)}. <code>peakwise check</code> repeats them on this machine.`
    : `${passed} of ${checks.length} checks passed in the run that made this report${escapeXml(kinds)}.`;
  const body =
    checks.length === 0
      ? '<p>No verification record came with this report. <code>peakwise check</code> runs the verification cases.</p>'
      : `<p>${when}${rec ? ' Each case is a model built in code in dimensionless consistent units, so its figures are ratios or numbers in those units, as the quantity in brackets says.' : ''}</p><ul class="checks">${checks
          .map(
            (c) =>
              `<li class="${c.pass ? 'pass' : 'fail'}"><span class="mark">${c.pass ? '✓' : '✗'}</span>${escapeXml(c.name)}` +
              `${c.referenceKind === 'independent-fe' ? ' <small>(FE reference value)</small>' : ''}` +
              `${c.detail ? ` <small>${escapeXml(c.detail)}</small>` : ''}</li>`,
          )
          .join('')}</ul>`;
  return `<section id="verification"><h2>Verification</h2>${body}</section>`;
}

function pageFooter(ctx: PageContext): string {
  const { study } = ctx;
  return `<footer><p class="caution">${escapeXml(CAUTION)}</p><p class="small">Made by peakwise ${escapeXml(study.version)} from ${escapeXml(study.model.file || 'a model built in code')}.</p></footer>`;
}

/** The whole page: header, model, mesh, picture, verdicts and sites (or the solve note), cut, verification, footer. */
export function reportHtml(input: ReportInput): string {
  const ctx = pageContext(input);
  const title = escapeXml(ctx.model.title || ctx.study.model.title || 'peakwise study');
  const studySections = ctx.solveOnly ? solveOnlySection() : `${verdictsSection(ctx)}\n${sitesSection(ctx)}`;
  return `<!DOCTYPE html>
<html lang="en" xmlns="http://www.w3.org/1999/xhtml">
<head>
<meta charset="utf-8"/>
<meta name="viewport" content="width=device-width, initial-scale=1"/>
<title>${title}</title>
<style>${plotCss}</style>
</head>
<body>
<input type="checkbox" id="show-mesh" class="toggle-input" aria-label="show element edges"/>
${pageHeader(ctx, title)}
<main>
${modelSection(ctx)}
${meshSection(ctx)}
${pictureSection(ctx)}
${studySections}
${cutSection(input.cut)}
${verificationSection(input.checks ?? [])}
</main>
${pageFooter(ctx)}
</body>
</html>
`;
}
