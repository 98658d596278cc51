/**
 * Key paths name a place in the model file the way a user reads it:
 * `plate.openings[0].circle.radius`, `loads[1].where`. The root is ''.
 */
export type PathSegment = string | number;

const PLAIN_KEY = /^[A-Za-z_][A-Za-z0-9_-]*$/;

export function formatPath(segments: readonly PathSegment[]): string {
  let out = '';
  for (const segment of segments) {
    if (typeof segment === 'number') out += `[${segment}]`;
    else if (PLAIN_KEY.test(segment)) out += out === '' ? segment : `.${segment}`;
    else out += `[${JSON.stringify(segment)}]`;
  }
  return out;
}

/** Inverse of formatPath, tolerant of what later stages may write. */
export function parsePath(keyPath: string): PathSegment[] {
  const segments: PathSegment[] = [];
  const pattern = /\[(\d+)\]|\[("(?:[^"\\]|\\.)*")\]|([^.[\]]+)/g;
  for (const match of keyPath.matchAll(pattern)) {
    if (match[1] !== undefined) segments.push(Number(match[1]));
    else if (match[2] !== undefined) segments.push(JSON.parse(match[2]) as string);
    else if (match[3] !== undefined) segments.push(match[3]);
  }
  return segments;
}

export function joinPath(base: string, ...more: PathSegment[]): string {
  return formatPath([...parsePath(base), ...more]);
}
