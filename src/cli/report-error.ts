import { MeshError, ModelError, PeakwiseError } from '../errors.js';
import { pointKeyPath } from '../model/index.js';
import type { Model } from '../model/types.js';

/** Strip terminal control characters from text that came from a file. */
export function plain(text: string): string {
  // eslint-disable-next-line no-control-regex
  return text.replace(/[\u0000-\u0008\u000b-\u001f\u007f-\u009f]/g, '');
}

/**
 * One line that names the file, line and column, the key path and what is wrong:
 *   models/x.yaml:12:7 loads[1].where: expected one of x, y, segment, opening, outline, point
 */
export function describeError(e: PeakwiseError, file: string | undefined, model: Model | undefined): string {
  let where = '';
  let line: number | undefined;
  let col: number | undefined;
  if (e instanceof ModelError) {
    line = e.line;
    col = e.col;
  }
  // an error about a point (a required node outside the plate): the entry that asked for it
  const keyPath = e.keyPath ?? (e instanceof MeshError && e.at && model ? pointKeyPath(model, e.at) : undefined);
  if (line === undefined && keyPath && model) {
    const pos = nearestPosition(model, keyPath);
    if (pos) {
      line = pos.line;
      col = pos.col;
    }
  }
  if (file) where = line !== undefined ? `${file}:${line}:${col ?? 1}` : file;
  const key = keyPath ? `${keyPath}: ` : '';
  let message = e.message;
  // stages sometimes start their message with the key path too; say it once
  if (keyPath && message.startsWith(`${keyPath}: `)) message = message.slice(keyPath.length + 2);
  // the other entry of a conflict: its line too, so both can be found
  for (const other of e.related ?? []) {
    const pos = model ? nearestPosition(model, other) : undefined;
    if (pos) message += ` (${other} is at line ${pos.line})`;
  }
  const head = [where, key].filter((s) => s.length > 0).join(' ');
  return plain(`${head.length > 0 ? head + (key ? '' : ': ') : ''}${message}`);
}

/** The position of a key path, or of its nearest ancestor that the source map knows. */
export function nearestPosition(model: Model, keyPath: string): { line: number; col: number } | undefined {
  let path = keyPath;
  while (path.length > 0) {
    const pos = model.sourceMap[path];
    if (pos) return pos;
    const cut = Math.max(path.lastIndexOf('.'), path.lastIndexOf('['));
    if (cut <= 0) break;
    path = path.slice(0, cut);
  }
  return model.sourceMap[path];
}
