// A site folder → a small HTTP server answering as the generated web-server rules do: 303 from minted IRIs by Accept,
// documents and downloads as files with their media types, security and caching headers, nothing outside the folder.
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import { createReadStream, existsSync, readFileSync, realpathSync, statSync } from 'node:fs';
import path from 'node:path';
import { UserError, EXIT } from '../errors.js';
import { docOf, routeOf, safeSegment, ROUTES } from '../site/routes.js';
import { negotiate, REPRESENTATIONS, FILE_TYPES } from '../site/negotiate.js';
import { SECURITY_HEADERS, CACHE } from '../site/rules.js';
import { readManifest, type SiteManifest } from '../site/manifest.js';

export type { SiteManifest };

/** Route kinds whose 303 names the resource as a fragment of its document (as the generated rules do). */
const FRAGMENT_KINDS = new Set(
  ROUTES.filter((r) => r.shardFolder || r.pattern.includes('(?:/.*)?')).map((r) => r.kind),
);

type Answer =
  | { kind: 'file'; file: string; type: string; vary: boolean }
  | { kind: 'redirect'; location: string }
  | { kind: 'error'; status: 400 | 404 | 405 | 406 };

/**
 * What a request path answers (pure, for tests): `rel` is the path after the base's path, still percent-encoded.
 * Decoded segments must be plain names (no `..`, `.`, empty, control characters or backslashes) and the resolved
 * file must lie inside the site folder, symbolic links resolved.
 */
export function answer(root: string, m: SiteManifest, rawRel: string, accept: string | undefined): Answer {
  let rel: string;
  try {
    rel = rawRel.split('/').map(decodeURIComponent).join('/');
  } catch {
    return { kind: 'error', status: 400 };
  }
  const dirIndex = rel === '' || rel.endsWith('/');
  const segs = (dirIndex ? rel.slice(0, -1) : rel).split('/').filter((s, i, a) => !(a.length === 1 && s === ''));
  if (!segs.every(safeSegment) || segs.some((s) => s.includes('/'))) return { kind: 'error', status: 404 };
  const inside = (f: string): string | null => {
    if (!existsSync(f)) return null;
    const real = realpathSync(f);
    const r = path.relative(root, real);
    return r.startsWith('..') || path.isAbsolute(r) || !statSync(real).isFile() ? null : real;
  };
  if (dirIndex) {
    const f = inside(path.join(root, ...segs, 'index.html'));
    return f ? { kind: 'file', file: f, type: FILE_TYPES['.html'], vary: false } : { kind: 'error', status: 404 };
  }
  const route = routeOf(rel);
  if (route) {
    const chosen = negotiate(accept);
    if (!chosen) return { kind: 'error', status: 406 };
    const doc = docOf(route, m.widths);
    if (!inside(path.join(root, ...doc.split('/')) + '.html')) return { kind: 'error', status: 404 };
    const base = new URL(m.base).pathname;
    const enc = (s: string) => s.split('/').map(encodeURIComponent).join('/');
    return {
      kind: 'redirect',
      location: `${base}${enc(doc)}${chosen.ext}${FRAGMENT_KINDS.has(route.kind) ? `#${enc(rel)}` : ''}`,
    };
  }
  const ext = path.extname(rel);
  const rep = REPRESENTATIONS.find((r) => r.ext === ext);
  if (rep) {
    const f = inside(path.join(root, ...segs).slice(0, -ext.length) + rep.file);
    return f
      ? {
          kind: 'file',
          file: f,
          type: rep.type === 'text/html' || rep.type === 'text/turtle' ? `${rep.type}; charset=utf-8` : rep.type,
          vary: true,
        }
      : { kind: 'error', status: 404 };
  }
  const f = inside(path.join(root, ...segs));
  return f
    ? { kind: 'file', file: f, type: FILE_TYPES[ext] ?? 'application/octet-stream', vary: false }
    : { kind: 'error', status: 404 };
}

const STATUS_TEXT: Record<number, string> = {
  400: 'Bad Request',
  404: 'Not Found',
  405: 'Method Not Allowed',
  406: 'Not Acceptable',
};

function handle(root: string, m: SiteManifest, req: IncomingMessage, res: ServerResponse): void {
  for (const [k, v] of Object.entries(SECURITY_HEADERS)) res.setHeader(k, v);
  if (req.method !== 'GET' && req.method !== 'HEAD') {
    res
      .writeHead(405, { Allow: 'GET, HEAD', 'Content-Type': 'text/plain; charset=utf-8' })
      .end('405 Method Not Allowed\n');
    return;
  }
  const base = new URL(m.base).pathname;
  const url = req.url ?? '/';
  const pathname = url.split(/[?#]/)[0];
  const a: Answer = pathname.startsWith(base)
    ? answer(root, m, pathname.slice(base.length), req.headers.accept)
    : { kind: 'error', status: 404 };
  if (a.kind === 'redirect') {
    res.writeHead(303, {
      Location: a.location,
      Vary: 'Accept',
      'Cache-Control': CACHE.redirect,
      'Content-Type': 'text/plain; charset=utf-8',
    });
    res.end(req.method === 'HEAD' ? undefined : `See Other: ${a.location}\n`);
    return;
  }
  if (a.kind === 'error') {
    const page = path.join(root, '404.html');
    const body =
      a.status === 404 && existsSync(page) ? readFileSync(page) : Buffer.from(`${a.status} ${STATUS_TEXT[a.status]}\n`);
    res.writeHead(a.status, {
      'Content-Type': a.status === 404 && existsSync(page) ? FILE_TYPES['.html'] : 'text/plain; charset=utf-8',
      'Content-Length': body.length,
      'Cache-Control': 'no-store',
      ...(a.status === 406 ? { Vary: 'Accept' } : {}),
    });
    res.end(req.method === 'HEAD' ? undefined : body);
    return;
  }
  const st = statSync(a.file);
  const etag = `"${st.size.toString(16)}-${Math.floor(st.mtimeMs).toString(16)}"`;
  const headers: Record<string, string | number> = {
    'Content-Type': a.type,
    'Cache-Control': CACHE.document,
    ETag: etag,
    'Last-Modified': st.mtime.toUTCString(),
  };
  if (a.vary) headers.Vary = 'Accept';
  if (req.headers['if-none-match'] === etag) {
    res.writeHead(304, headers).end();
    return;
  }
  headers['Content-Length'] = st.size;
  res.writeHead(200, headers);
  if (req.method === 'HEAD') {
    res.end();
    return;
  }
  createReadStream(a.file)
    .on('error', () => res.destroy())
    .pipe(res);
}

/** Why the server could not listen, as the option to change (EADDRINUSE, EACCES, EADDRNOTAVAIL: listen(2)). */
type Listen = { port: number; host: string };
const LISTEN_ERRORS: Record<string, (o: Listen) => [field: string, message: string, hint: string]> = {
  EADDRINUSE: (o) => [
    '--port',
    `port ${o.port} on ${o.host} is in use`,
    `stop what uses it or give --port ${o.port + 1}`,
  ],
  EACCES: (o) => ['--port', `port ${o.port} needs privileges this user lacks`, 'give a port of 1024 or above'],
  EADDRNOTAVAIL: (o) => ['--host', `${o.host} is not an address of this machine`, 'give 127.0.0.1 or one of its own'],
};

function listenError(err: Error, site: string, o: { port: number; host: string }): Error {
  const known = LISTEN_ERRORS[(err as NodeJS.ErrnoException).code ?? ''];
  if (!known) return err;
  const [field, message, hint] = known(o);
  return new UserError({ file: site, line: 0, field, message, hint }, EXIT.badInput);
}

/** Starts the server; resolves once listening, with its URL and a close function. */
export async function serveSite(
  site: string,
  opts: { port: number; host: string },
): Promise<{ url: string; server: Server; close: () => Promise<void> }> {
  const root = realpathSync(path.resolve(site));
  const m = readManifest(root);
  const server = createServer((req, res) => {
    try {
      handle(root, m, req, res);
    } catch {
      if (!res.headersSent) res.writeHead(500).end();
      else res.destroy();
    }
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', (err) => reject(listenError(err, site, opts)));
    server.listen(opts.port, opts.host, () => resolve());
  });
  const addr = server.address();
  const port = typeof addr === 'object' && addr ? addr.port : opts.port;
  const host = opts.host.includes(':') ? `[${opts.host}]` : opts.host;
  return {
    url: `http://${host}:${port}${new URL(m.base).pathname}`,
    server,
    close: () => new Promise((r) => server.close(() => r())),
  };
}
