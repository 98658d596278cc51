/**
 * The small local web server of `study --watch` (docs/watch.md): the files of one output folder,
 * over HTTP on 127.0.0.1 only, read-only, and a stream of run events the served report listens to.
 *
 * Rules: GET and HEAD only; the Host header must name this server (127.0.0.1 or localhost and its
 * port — a page elsewhere that points a name of its own at 127.0.0.1 gets nothing); the path is
 * decoded once and refused when a segment is empty, `.`, `..` or starts with a dot, or holds a
 * backslash, NUL or an encoded slash; the file's real path (links resolved) must lie inside the
 * folder's real path, and it must be a regular file; run.lock and temporary files are not served.
 * HTML pages are served with a short script added before `</body>` that reloads the page when a
 * new run has finished (server-sent events at /.peakwise/events) and shows a bad edit's message;
 * the file on disk is never changed, so the report is the same as without watch mode.
 */
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import { readFileSync, realpathSync, statSync } from 'node:fs';
import { extname, join, sep } from 'node:path';
import type { AddressInfo } from 'node:net';
import { LOCK_NAME } from './lock.js';

/** Where the served pages listen for runs (a dot path: never a file of the folder). */
export const EVENTS_PATH = '/.peakwise/events';

const TYPES: Readonly<Record<string, string>> = {
  '.html': 'text/html; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.csv': 'text/csv; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.txt': 'text/plain; charset=utf-8',
  '.png': 'image/png',
};

/**
 * The script added to served HTML: the page knows its run id (the `peakwise-run` meta every
 * report carries); a `run` event with another id reloads it, an `error` event shows the message
 * in a bar at the top until the next run.
 */
export const REFRESH_SCRIPT = `<script>(() => {
  const meta = document.querySelector('meta[name="peakwise-run"]');
  const mine = meta ? meta.getAttribute('content') : '';
  const events = new EventSource(${JSON.stringify(EVENTS_PATH)});
  events.addEventListener('run', (e) => { if (e.data !== mine) location.reload(); });
  events.addEventListener('error-line', (e) => {
    let bar = document.getElementById('peakwise-watch-error');
    if (!bar) {
      bar = document.createElement('div');
      bar.id = 'peakwise-watch-error';
      bar.setAttribute('role', 'alert');
      bar.style.cssText = 'position:sticky;top:0;z-index:10;padding:6px 10px;background:#fdecea;color:#611a15;border-bottom:1px solid #e6a29b;font:13px/1.4 system-ui,sans-serif;white-space:pre-wrap';
      document.body.prepend(bar);
    }
    bar.textContent = 'the last edit did not run: ' + e.data;
  });
})();</script>`;

/** The served form of an HTML page: the refresh script before `</body>` (at the end when there is none). */
export function withRefreshScript(html: string): string {
  const i = html.lastIndexOf('</body>');
  return i < 0 ? html + REFRESH_SCRIPT : html.slice(0, i) + REFRESH_SCRIPT + html.slice(i);
}

export interface FolderServer {
  /** http://127.0.0.1:port/ */
  url: string;
  port: number;
  /** tell the open pages that the run `runId` has finished */
  announceRun(runId: string): void;
  /** tell the open pages that the last edit failed (one line) */
  announceError(line: string): void;
  close(): Promise<void>;
}

/** The file a request path names inside `root` (a real path), or undefined when it is not one we serve. */
export function servedFile(root: string, urlPath: string): string | undefined {
  let path: string;
  try {
    path = decodeURIComponent(urlPath);
  } catch {
    return undefined;
  }
  if (/%2f|%5c/i.test(urlPath) || path.includes('\0') || path.includes('\\')) return undefined;
  if (path === '/' || path === '') path = '/report.html';
  if (!path.startsWith('/')) return undefined;
  const parts = path.slice(1).split('/');
  if (parts.some((p) => p === '' || p === '.' || p === '..' || p.startsWith('.'))) return undefined;
  if (parts[parts.length - 1] === LOCK_NAME) return undefined;
  let real: string;
  try {
    real = realpathSync(join(root, ...parts));
  } catch {
    return undefined;
  }
  if (!real.startsWith(root + sep)) return undefined;
  try {
    if (!statSync(real).isFile()) return undefined;
  } catch {
    return undefined;
  }
  return real;
}

/** Serve the folder `root` (a real path) on 127.0.0.1:`port` (0: a free port). */
export function serveFolder(root: string, port = 0): Promise<FolderServer> {
  const clients = new Set<ServerResponse>();
  let lastRun = '';
  let lastError = '';
  const send = (res: ServerResponse, event: string, data: string): void => {
    res.write(`event: ${event}\n${data.split('\n').map((l) => `data: ${l}`).join('\n')}\n\n`);
  };
  let actualPort = port;
  const handle = (req: IncomingMessage, res: ServerResponse): void => {
    const host = req.headers.host ?? '';
    if (host !== `127.0.0.1:${actualPort}` && host !== `localhost:${actualPort}`) {
      res.writeHead(421, { 'Content-Type': 'text/plain; charset=utf-8' }).end('this server answers only to 127.0.0.1\n');
      return;
    }
    if (req.method !== 'GET' && req.method !== 'HEAD') {
      res.writeHead(405, { Allow: 'GET, HEAD', 'Content-Type': 'text/plain; charset=utf-8' }).end('read only\n');
      return;
    }
    const urlPath = (req.url ?? '/').split('?')[0].split('#')[0];
    if (urlPath === EVENTS_PATH) {
      res.writeHead(200, { 'Content-Type': 'text/event-stream; charset=utf-8', 'Cache-Control': 'no-store', Connection: 'keep-alive' });
      res.write('retry: 500\n\n');
      if (lastRun) send(res, 'run', lastRun);
      if (lastError) send(res, 'error-line', lastError);
      clients.add(res);
      req.on('close', () => clients.delete(res));
      return;
    }
    const file = servedFile(root, urlPath);
    if (!file) {
      res.writeHead(404, { 'Content-Type': 'text/plain; charset=utf-8', 'Cache-Control': 'no-store' }).end('not a file of this result folder\n');
      return;
    }
    const ext = extname(file).toLowerCase();
    let body: Buffer;
    try {
      body = readFileSync(file);
    } catch {
      res.writeHead(404, { 'Content-Type': 'text/plain; charset=utf-8' }).end('not readable now\n');
      return;
    }
    if (ext === '.html') body = Buffer.from(withRefreshScript(body.toString('utf8')), 'utf8');
    res.writeHead(200, {
      'Content-Type': TYPES[ext] ?? 'application/octet-stream',
      'Content-Length': body.length,
      'Cache-Control': 'no-store',
      'X-Content-Type-Options': 'nosniff',
    });
    res.end(req.method === 'HEAD' ? undefined : body);
  };
  const server: Server = createServer(handle);
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => {
      server.off('error', reject);
      actualPort = (server.address() as AddressInfo).port;
      resolve({
        url: `http://127.0.0.1:${actualPort}/`,
        port: actualPort,
        announceRun(runId) {
          lastRun = runId;
          lastError = '';
          for (const c of clients) send(c, 'run', runId);
        },
        announceError(line) {
          lastError = line;
          for (const c of clients) send(c, 'error-line', line);
        },
        close: () => new Promise<void>((done) => {
          for (const c of clients) c.end();
          clients.clear();
          server.closeAllConnections();
          server.close(() => done());
        }),
      });
    });
  });
}
