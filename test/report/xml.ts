/**
 * A small strict XML well-formedness checker for the tests: balanced tags, quoted and unique
 * attributes, valid entity references, no stray `<` or `&`. Enough for our SVG output (no
 * CDATA, no DTD subsets). Returns the list of problems (empty when well-formed) and the
 * element count.
 */
export function checkXml(text: string): { errors: string[]; elements: number; root?: string } {
  const errors: string[] = [];
  const stack: string[] = [];
  let elements = 0;
  let root: string | undefined;
  let i = 0;
  const name = /^[A-Za-z_:][A-Za-z0-9_.:-]*/;
  const entity = /^&(?:[A-Za-z][A-Za-z0-9]*|#[0-9]+|#x[0-9A-Fa-f]+);/;
  const checkText = (s: string, where: number) => {
    for (let k = s.indexOf('&'); k >= 0; k = s.indexOf('&', k + 1)) {
      if (!entity.test(s.slice(k))) errors.push(`bad entity at ${where + k}`);
    }
    if (s.includes('<')) errors.push(`stray < at ${where}`);
  };
  while (i < text.length) {
    const lt = text.indexOf('<', i);
    const chunk = lt < 0 ? text.slice(i) : text.slice(i, lt);
    checkText(chunk, i);
    if (lt < 0) break;
    if (text.startsWith('<!--', lt)) {
      const end = text.indexOf('-->', lt);
      if (end < 0) { errors.push('unclosed comment'); break; }
      i = end + 3;
      continue;
    }
    if (text.startsWith('<!DOCTYPE', lt) || text.startsWith('<!doctype', lt)) {
      i = text.indexOf('>', lt) + 1;
      continue;
    }
    if (text.startsWith('<?', lt)) {
      const end = text.indexOf('?>', lt);
      if (end < 0) { errors.push('unclosed declaration'); break; }
      i = end + 2;
      continue;
    }
    const gt = findTagEnd(text, lt);
    if (gt < 0) { errors.push(`unclosed tag at ${lt}`); break; }
    const inner = text.slice(lt + 1, gt);
    if (inner.startsWith('/')) {
      const n = inner.slice(1).trim();
      const open = stack.pop();
      if (open !== n) errors.push(`</${n}> closes <${open ?? 'nothing'}> at ${lt}`);
    } else {
      const selfClosing = inner.endsWith('/');
      const body = selfClosing ? inner.slice(0, -1) : inner;
      const m = name.exec(body);
      if (!m) { errors.push(`bad tag name at ${lt}`); i = gt + 1; continue; }
      if (stack.length === 0) {
        if (root !== undefined) errors.push(`second root element <${m[0]}> at ${lt}`);
        root = m[0];
      }
      elements++;
      const attrs = body.slice(m[0].length);
      const seen = new Set<string>();
      const attr = /\s+([A-Za-z_:][A-Za-z0-9_.:-]*)\s*=\s*("[^"]*"|'[^']*')/y;
      let p = 0;
      while (p < attrs.length) {
        attr.lastIndex = p;
        const a = attr.exec(attrs);
        if (!a) {
          if (attrs.slice(p).trim() !== '') errors.push(`bad attribute syntax in <${m[0]}> at ${lt}: ${attrs.slice(p, p + 40)}`);
          break;
        }
        if (seen.has(a[1])) errors.push(`duplicate attribute ${a[1]} at ${lt}`);
        seen.add(a[1]);
        const value = a[2].slice(1, -1);
        if (value.includes('<')) errors.push(`< in attribute ${a[1]} at ${lt}`);
        checkText(value.replace(/</g, ''), lt);
        p = attr.lastIndex;
      }
      if (!selfClosing) stack.push(m[0]);
    }
    i = gt + 1;
  }
  if (stack.length > 0) errors.push(`unclosed elements: ${stack.join(' ')}`);
  if (root === undefined) errors.push('no root element');
  return { errors, elements, root };
}

/** Index of the `>` that ends the tag starting at `lt`, skipping quoted attribute values. */
function findTagEnd(text: string, lt: number): number {
  let quote = '';
  for (let k = lt + 1; k < text.length; k++) {
    const ch = text[k];
    if (quote) {
      if (ch === quote) quote = '';
    } else if (ch === '"' || ch === "'") quote = ch;
    else if (ch === '>') return k;
  }
  return -1;
}

/** All `<svg …>…</svg>` fragments of an HTML page (not nested in our output). */
export function svgFragments(html: string): string[] {
  const out: string[] = [];
  let k = 0;
  for (;;) {
    const a = html.indexOf('<svg', k);
    if (a < 0) break;
    const b = html.indexOf('</svg>', a);
    out.push(html.slice(a, b + 6));
    k = b + 6;
  }
  return out;
}

/** sRGB relative luminance of "#rrggbb" (IEC 61966-2-1 transfer, Rec. 709 weights, as in WCAG 2). */
export function luminance(hex: string): number {
  const m = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
  if (!m) throw new Error(`not a colour: ${hex}`);
  const lin = (c: string) => {
    const v = parseInt(c, 16) / 255;
    return v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4;
  };
  return 0.2126 * lin(m[1]) + 0.7152 * lin(m[2]) + 0.0722 * lin(m[3]);
}
