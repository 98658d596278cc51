/**
 * Small text helpers for messages: describing a value the user wrote, quoting it safely
 * for a terminal, and "did you mean" suggestions.
 */

const MAX_QUOTED = 48;

/**
 * Quote user text for a one-line message. Control characters are replaced (a model file
 * could hold escape sequences that would repaint the terminal) and long text is cut.
 */
export function quote(text: string): string {
  // eslint-disable-next-line no-control-regex
  let clean = text.replace(/[\u0000-\u001f\u007f-\u009f\u2028\u2029]/g, '?');
  if (clean.length > MAX_QUOTED) clean = `${clean.slice(0, MAX_QUOTED - 1)}…`;
  return `'${clean}'`;
}

/** A short description of a parsed YAML value, for "expected …, got …" messages. */
export function describe(value: unknown): string {
  if (value === undefined) return 'nothing';
  if (value === null) return 'an empty value';
  if (typeof value === 'boolean') return `${value}`;
  if (typeof value === 'number') return `${value}`;
  if (typeof value === 'string') return value.trim() === '' ? 'empty text' : quote(value);
  if (Array.isArray(value)) {
    if (value.length === 0) return 'an empty list';
    return value.length === 1 ? 'a list of 1 item' : `a list of ${value.length} items`;
  }
  if (typeof value === 'object') {
    const keys = Object.keys(value as object);
    if (keys.length === 0) return 'an empty mapping';
    const shown = keys.slice(0, 4).map((k) => quote(k)).join(', ');
    return `a mapping with ${keys.length === 1 ? 'key' : 'keys'} ${shown}${keys.length > 4 ? ', …' : ''}`;
  }
  return typeof value;
}

/**
 * Optimal string alignment distance (Levenshtein with adjacent transpositions), so that
 * `raduis` is one edit from `radius`.
 */
export function editDistance(a: string, b: string): number {
  const n = a.length;
  const m = b.length;
  if (n === 0) return m;
  if (m === 0) return n;
  const width = m + 1;
  const d = new Uint32Array((n + 1) * width);
  for (let i = 0; i <= n; i++) d[i * width] = i;
  for (let j = 0; j <= m; j++) d[j] = j;
  for (let i = 1; i <= n; i++) {
    for (let j = 1; j <= m; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let best = Math.min(d[(i - 1) * width + j] + 1, d[i * width + j - 1] + 1, d[(i - 1) * width + j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) {
        best = Math.min(best, d[(i - 2) * width + j - 2] + 1);
      }
      d[i * width + j] = best;
    }
  }
  return d[n * width + m];
}

/**
 * The closest candidate to `name`, or undefined when none is close enough to be a likely
 * typo. Case is ignored for the distance (so `e` suggests `E`); the allowed distance grows
 * with the length of the name, about one edit per three characters.
 */
export function closest(name: string, candidates: readonly string[]): string | undefined {
  const lower = name.toLowerCase();
  const allowed = Math.max(1, Math.floor(name.length / 3));
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const candidate of candidates) {
    if (candidate === name) continue;
    const distance = editDistance(lower, candidate.toLowerCase());
    if (distance < bestDistance) {
      bestDistance = distance;
      best = candidate;
    }
  }
  if (best !== undefined && bestDistance <= allowed && bestDistance < Math.max(name.length, best.length)) return best;
  // an abbreviation such as `r` for `radius`, when only one candidate starts that way
  const starts = candidates.filter((c) => c !== name && c.toLowerCase().startsWith(lower));
  return lower.length > 0 && starts.length === 1 ? starts[0] : undefined;
}

/** ` (did you mean 'radius'?)` or '' — ready to append to a message. */
export function didYouMean(name: string, candidates: readonly string[]): string {
  const hint = closest(name, candidates);
  return hint === undefined ? '' : ` (did you mean ${quote(hint)}?)`;
}

/** `a, b or c` */
export function listOr(items: readonly string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} or ${items[items.length - 1]}`;
}

/** A number as it reads in a message: short, no float noise. */
export function formatNumber(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return '0';
  const abs = Math.abs(value);
  if (abs >= 1e6 || abs < 1e-4) return value.toExponential(3).replace(/\.?0+e/, 'e').replace('e+', 'e');
  return String(Number(value.toPrecision(6)));
}
