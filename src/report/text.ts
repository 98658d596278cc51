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

/** Most significant digits a banded value is ever printed with (a band far below the value). */
const MAX_BANDED_DIGITS = 9;

/**
 * A value with its discretisation band, rounded to what the band says is meaningful: the band to
 * two significant digits, the value to the same decimal place (143.1234 ± 0.0044, 434.8 ± 1.2,
 * 1230 ± 570). A value would never get more than 9 significant digits: past that the band is
 * far below anything a drawing can hold, and it is then shown on its own to two digits
 * (141.662345 ± 9.2e−6 style rounding stops at 9 digits). A band that is zero, missing or not
 * finite leaves the value at 6 significant digits and the band "n/a" (or "0").
 */
export function formatBand(value: number, band: number): { value: string; band: string } {
  if (!Number.isFinite(value)) return { value: formatNumber(value), band: formatNumber(Math.abs(band), 2) };
  const b = Math.abs(band);
  if (!Number.isFinite(b)) return { value: formatNumber(value, 6), band: 'n/a' };
  if (b === 0) return { value: formatNumber(value, 6), band: '0' };
  let e = Math.floor(Math.log10(b));
  // rounding to two digits may carry into the next decade (0.0996 → 0.10)
  if (Math.round(b / 10 ** (e - 1)) >= 100) e += 1;
  const decimals = 1 - e;
  const valueDigits = (value === 0 ? 1 : Math.floor(Math.log10(Math.abs(value))) + 1) + decimals;
  if (valueDigits > MAX_BANDED_DIGITS) return { value: formatNumber(value, MAX_BANDED_DIGITS), band: formatNumber(b, 2) };
  const fixed = (v: number): string => {
    if (decimals >= 0) return v.toFixed(decimals);
    const step = 10 ** -decimals;
    return (Math.round(v / step) * step).toFixed(0);
  };
  const v = fixed(value);
  const text = /^-0(\.0*)?$/.test(v) ? v.slice(1) : v; // no −0.00
  return { value: text.replace('-', '−'), band: fixed(b) };
}
