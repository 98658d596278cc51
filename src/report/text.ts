/**
 * Text hygiene shared by every output format. Model-provided strings (title, units, opening ids,
 * file names, site descriptions) can hold anything a YAML file can hold, so each format cleans
 * them at its own edge: the terminal drops control characters, HTML/SVG escapes markup, CSV
 * quotes and guards against formula injection (see csv.ts).
 */

/**
 * C0 controls (incl. ESC, CR, LF, TAB), DEL, C1 controls, and the Unicode bidirectional
 * embedding / override / isolate marks, which can make a terminal line read differently from
 * the bytes it holds.
 */
// eslint-disable-next-line no-control-regex
const CONTROL_CHARS = /[\u0000-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/g;

/** Removes control characters (tab and line breaks become one space; others vanish). */
export function stripControl(text: string): string {
  return String(text)
    .replace(/[\t\r\n]+/g, ' ')
    .replace(CONTROL_CHARS, '');
}

const HTML_ESCAPES: Record<string, string> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&quot;',
  "'": '&#39;',
};

/** Escapes text for HTML and SVG element content and quoted attribute values. */
export function escapeXml(text: string): string {
  return stripControl(text).replace(/[&<>"']/g, (c) => HTML_ESCAPES[c]);
}

/** A value safe inside an `id` attribute and a CSS selector: letters, digits, `_` and `-` only. */
export function safeId(text: string): string {
  const cleaned = stripControl(text).replace(/[^A-Za-z0-9_-]/g, '_');
  return cleaned.length > 0 ? cleaned : '_';
}

/**
 * A number for people: `sig` significant digits, no trailing zeros, exponent form only for
 * very large or very small magnitudes. Non-finite values print as words.
 */
export function formatNumber(value: number | undefined, sig = 4): string {
  if (value === undefined || Number.isNaN(value)) return 'n/a';
  if (!Number.isFinite(value)) return value > 0 ? '∞' : '−∞';
  if (value === 0) return '0';
  const abs = Math.abs(value);
  let text: string;
  if (abs >= 1e-3 && abs < 1e7) {
    text = Number(value.toPrecision(sig)).toString();
    // toString may itself switch to exponent form for e.g. 1e-7; the range check above avoids it
  } else {
    const [mantissa, exponent] = value.toExponential(sig - 1).split('e');
    text = `${Number(mantissa).toString()}e${Number(exponent)}`;
  }
  return text.replace('-', '−');
}

/** Fixed decimals with a true minus sign (used for exponents: "q = 0.46"). */
export function formatFixed(value: number, decimals: number): string {
  if (!Number.isFinite(value)) return formatNumber(value);
  return value.toFixed(decimals).replace('-', '−');
}

/** "(x, y)" with the length unit. */
export function formatPoint(at: readonly [number, number], lengthUnit: string): string {
  return `(${formatNumber(at[0])}, ${formatNumber(at[1])}) ${stripControl(lengthUnit)}`.trimEnd();
}
