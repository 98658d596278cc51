/**
 * Is this text what a UTF-8 text file decodes to? The CLI reads model and imported files as
 * UTF-8; a UTF-16 file, a binary file or a file in another 8-bit encoding then turns into zero
 * characters (U+0000) and replacement characters (U+FFFD, what invalid UTF-8 bytes become).
 * Saying so in one line beats a YAML syntax error that quotes kilobytes of garbage.
 */

export interface NotText {
  /** completes "… is not a UTF-8 text file: " */
  reason: string;
  /** 1-based position of the first offending character */
  line: number;
  col: number;
}

function positionOf(text: string, offset: number): { line: number; col: number } {
  let line = 1;
  let start = 0;
  for (let k = 0; k < offset; k++) {
    if (text.charCodeAt(k) === 10) {
      line++;
      start = k + 1;
    }
  }
  return { line, col: offset - start + 1 };
}

/**
 * Why `text` is not a UTF-8 text file, or undefined when it is one. Looks for, in order: the
 * zero bytes of UTF-16/UTF-32 (a byte-order mark read as UTF-8 gives two U+FFFD first, and
 * ASCII letters in UTF-16 carry a zero byte each), any other zero byte (binary data: random
 * bytes hold one every 256 on average), and bytes that are not UTF-8 (U+FFFD). Other control
 * characters are left to the format's own reader.
 */
export function notUtf8Text(text: string): NotText | undefined {
  const nul = text.indexOf('\u0000');
  if (nul >= 0) {
    const sample = Math.min(text.length, 512);
    let zeros = 0;
    for (let k = 0; k < sample; k++) if (text.charCodeAt(k) === 0) zeros++;
    const bom = text.startsWith('\uFFFD\uFFFD');
    // UTF-16 of ASCII text: every second byte is zero (UTF-32: three in four)
    if (bom || zeros >= 0.3 * sample) {
      return { reason: 'it looks like UTF-16 (a zero byte beside every letter); save it as UTF-8', ...positionOf(text, bom ? 0 : nul) };
    }
    return { reason: 'it holds a zero byte, so it looks like a binary file', ...positionOf(text, nul) };
  }
  const bad = text.indexOf('\uFFFD');
  if (bad >= 0) {
    return {
      reason: 'it holds bytes that are not UTF-8 (another encoding such as Latin-1 or Windows-1252?); save it as UTF-8',
      ...positionOf(text, bad),
    };
  }
  return undefined;
}
