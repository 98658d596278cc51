/**
 * Minimal PNG reader for the browser test: 8-bit greyscale / RGB / RGBA, non-interlaced (what
 * Chromium's screenshots are). PNG specification (W3C, 2nd ed. 2003): chunks after the
 * 8-byte signature, zlib-compressed IDAT stream, one filter byte per scanline (§9).
 */
import { inflateSync } from 'node:zlib';

export interface Image {
  width: number;
  height: number;
  /** RGBA, 4 bytes per pixel */
  rgba: Uint8Array;
}

export function decodePng(buf: Buffer): Image {
  const sig = [137, 80, 78, 71, 13, 10, 26, 10];
  sig.forEach((b, i) => {
    if (buf[i] !== b) throw new Error('not a PNG');
  });
  let p = 8;
  let width = 0, height = 0, bitDepth = 0, colourType = 0, interlace = 0;
  const idat: Buffer[] = [];
  while (p < buf.length) {
    const len = buf.readUInt32BE(p);
    const type = buf.toString('latin1', p + 4, p + 8);
    const data = buf.subarray(p + 8, p + 8 + len);
    if (type === 'IHDR') {
      width = data.readUInt32BE(0);
      height = data.readUInt32BE(4);
      bitDepth = data[8];
      colourType = data[9];
      interlace = data[12];
    } else if (type === 'IDAT') idat.push(data);
    else if (type === 'IEND') break;
    p += 12 + len;
  }
  const channels = { 0: 1, 2: 3, 6: 4, 4: 2 }[colourType as 0 | 2 | 6 | 4];
  if (bitDepth !== 8 || !channels || interlace !== 0) throw new Error(`unsupported PNG: depth ${bitDepth}, type ${colourType}`);
  const raw = inflateSync(Buffer.concat(idat));
  const stride = width * channels;
  const out = new Uint8Array(stride * height);
  const paeth = (a: number, b: number, c: number) => {
    const pa = Math.abs(b - c), pb = Math.abs(a - c), pc = Math.abs(a + b - 2 * c);
    return pa <= pb && pa <= pc ? a : pb <= pc ? b : c;
  };
  for (let y = 0; y < height; y++) {
    const filter = raw[y * (stride + 1)];
    const src = y * (stride + 1) + 1;
    for (let x = 0; x < stride; x++) {
      const a = x >= channels ? out[y * stride + x - channels] : 0;
      const b = y > 0 ? out[(y - 1) * stride + x] : 0;
      const c = x >= channels && y > 0 ? out[(y - 1) * stride + x - channels] : 0;
      const v = raw[src + x];
      const pred = filter === 0 ? 0 : filter === 1 ? a : filter === 2 ? b : filter === 3 ? (a + b) >> 1 : paeth(a, b, c);
      out[y * stride + x] = (v + pred) & 255;
    }
  }
  const rgba = new Uint8Array(width * height * 4);
  for (let i = 0; i < width * height; i++) {
    const s = i * channels;
    if (channels >= 3) {
      rgba[4 * i] = out[s]; rgba[4 * i + 1] = out[s + 1]; rgba[4 * i + 2] = out[s + 2];
    } else {
      rgba[4 * i] = rgba[4 * i + 1] = rgba[4 * i + 2] = out[s];
    }
    rgba[4 * i + 3] = channels === 4 ? out[s + 3] : channels === 2 ? out[s + 1] : 255;
  }
  return { width, height, rgba };
}

export function distinctColours(img: Image): number {
  const seen = new Set<number>();
  for (let i = 0; i < img.width * img.height; i++) {
    seen.add((img.rgba[4 * i] << 16) | (img.rgba[4 * i + 1] << 8) | img.rgba[4 * i + 2]);
  }
  return seen.size;
}
