/**
 * The local server of `study --watch` (src/cli/serve.ts): 127.0.0.1 only, read-only, the files of
 * one folder and nothing else — no way out by `..` in any spelling, by an encoded slash or
 * backslash, by a link that leads out, to a dot file or to the lock — a Host check against
 * names pointed at 127.0.0.1 from elsewhere, the refresh script only in served HTML (never in the
 * file), and the run events.
 */
import { mkdirSync, mkdtempSync, readFileSync, realpathSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { request } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EVENTS_PATH, serveFolder, servedFile, withRefreshScript, type FolderServer } from '../../src/cli/serve.js';

const base = mkdtempSync(join(tmpdir(), 'peakwise-serve-'));
const root = realpathSync(join(base));
const folder = join(root, 'out');
const REPORT = '<!doctype html><html><head><meta name="peakwise-run" content="abc"/></head><body><p>report</p></body></html>';

interface Reply { status: number; body: string; headers: Record<string, string | string[] | undefined> }

/** a raw request: the path goes on the wire exactly as written (no client-side normalisation) */
function get(server: FolderServer, path: string, opts: { method?: string; host?: string } = {}): Promise<Reply> {
  return new Promise((resolve, reject) => {
    const req = request({ host: '127.0.0.1', port: server.port, path, method: opts.method ?? 'GET', headers: { host: opts.host ?? `127.0.0.1:${server.port}` } }, (res) => {
      let body = '';
      res.setEncoding('utf8');
      res.on('data', (c: string) => { body += c; });
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body, headers: res.headers }));
    });
    req.on('error', reject);
    req.end();
  });
}

let server: FolderServer;

beforeAll(async () => {
  mkdirSync(join(folder, 'points'), { recursive: true });
  writeFileSync(join(folder, 'report.html'), REPORT);
  writeFileSync(join(folder, 'study.json'), '{"a": 1}\n');
  writeFileSync(join(folder, 'points', 'p.json'), '{}\n');
  writeFileSync(join(folder, 'run.lock'), '{"pid": 1}\n');
  writeFileSync(join(folder, '.hidden'), 'secret\n');
  writeFileSync(join(root, 'secret.txt'), 'outside the folder\n');
  symlinkSync(join(root, 'secret.txt'), join(folder, 'link.txt'));
  symlinkSync(root, join(folder, 'up'));
  server = await serveFolder(folder);
});

afterAll(async () => {
  await server?.close();
  rmSync(base, { recursive: true, force: true });
});

describe('what is served', () => {
  it('listens on 127.0.0.1 and serves the folder files, HTML with the refresh script, the file itself unchanged', async () => {
    expect(server.url).toBe(`http://127.0.0.1:${server.port}/`);
    const page = await get(server, '/report.html');
    expect(page.status).toBe(200);
    expect(page.headers['content-type']).toBe('text/html; charset=utf-8');
    expect(page.body).toBe(withRefreshScript(REPORT));
    expect(page.body).toContain(`new EventSource("${EVENTS_PATH}")`);
    expect(page.body.indexOf('<script>')).toBeLessThan(page.body.indexOf('</body>'));
    expect(readFileSync(join(folder, 'report.html'), 'utf8')).toBe(REPORT);
    expect((await get(server, '/')).body).toBe(page.body);
    const json = await get(server, '/study.json');
    expect(json.body).toBe('{"a": 1}\n');
    expect(json.headers['content-type']).toBe('application/json; charset=utf-8');
    expect((await get(server, '/points/p.json')).status).toBe(200);
    expect((await get(server, '/study.json', { method: 'HEAD' })).status).toBe(200);
  });

  it('refuses every way out of the folder, dot files, the lock and folders', async () => {
    const refused = [
      '/../secret.txt', '/points/../../secret.txt', '/%2e%2e/secret.txt', '/%2E%2E/secret.txt', '/..%2fsecret.txt',
      '/points%2f..%2f..%2fsecret.txt', '/..%5csecret.txt', '/..\\secret.txt', '/link.txt', '/up/secret.txt',
      '/.hidden', '/run.lock', '/points', '/points/', '//etc/passwd', '/%00', '/%E0%A4%A', '/nothing.html', '/./study.json',
    ];
    for (const path of refused) {
      const r = await get(server, path);
      expect(r.status, path).toBe(404);
      expect(r.body, path).not.toContain('outside the folder');
      expect(r.body, path).not.toContain('secret');
    }
    // the pure rule, for paths an HTTP client could not even send
    expect(servedFile(folder, '/study.json')).toBe(join(folder, 'study.json'));
    expect(servedFile(folder, 'study.json')).toBeUndefined();
    expect(servedFile(folder, '/points/../study.json')).toBeUndefined();
  });

  it('answers only to its own host name, and only reads', async () => {
    expect((await get(server, '/report.html', { host: 'attacker.example:80' })).status).toBe(421);
    expect((await get(server, '/report.html', { host: `evil.example:${server.port}` })).status).toBe(421);
    expect((await get(server, '/report.html', { host: `localhost:${server.port}` })).status).toBe(200);
    for (const method of ['POST', 'PUT', 'DELETE']) expect((await get(server, '/study.json', { method })).status).toBe(405);
    expect(readFileSync(join(folder, 'study.json'), 'utf8')).toBe('{"a": 1}\n');
  });
});

describe('run events', () => {
  it('a page that connects gets the last run at once, then each new run and each failed edit', async () => {
    server.announceRun('run-1');
    const events: string[] = [];
    await new Promise<void>((resolve, reject) => {
      const req = request({ host: '127.0.0.1', port: server.port, path: EVENTS_PATH, headers: { host: `127.0.0.1:${server.port}` } }, (res) => {
        expect(res.headers['content-type']).toBe('text/event-stream; charset=utf-8');
        res.setEncoding('utf8');
        let buf = '';
        res.on('data', (c: string) => {
          buf += c;
          let i: number;
          while ((i = buf.indexOf('\n\n')) >= 0) {
            const block = buf.slice(0, i);
            buf = buf.slice(i + 2);
            const ev = /^event: (.*)$/m.exec(block)?.[1];
            const data = block.split('\n').filter((l) => l.startsWith('data: ')).map((l) => l.slice(6)).join('\n');
            if (ev) events.push(`${ev}=${data}`);
            if (events.length === 1) server.announceError('m.yaml:3:1: bad\nsecond line');
            if (events.length === 2) server.announceRun('run-2');
            if (events.length === 3) { req.destroy(); resolve(); }
          }
        });
      });
      req.on('error', (e) => (events.length >= 3 ? resolve() : reject(e)));
      req.end();
    });
    expect(events).toEqual(['run=run-1', 'error-line=m.yaml:3:1: bad\nsecond line', 'run=run-2']);
  });
});
