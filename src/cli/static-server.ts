/**
 * A minimal static file server for the built site (dist/), bound to 127.0.0.1.
 * Used by `strobe site --serve` and by the browser tests; it serves files only
 * from inside the root folder, never lists directories, answers only GET and
 * HEAD (405 with Allow otherwise), and sends headers that keep a browser from
 * guessing content types (nosniff) or running anything the site did not ship
 * as a file of its own (a Content-Security-Policy without inline scripts).
 */
import { createServer, type Server } from 'node:http';
import { readFile, stat } from 'node:fs/promises';
import { extname, join, normalize, resolve, sep } from 'node:path';

const CONTENT_TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.ico': 'image/x-icon',
  '.woff2': 'font/woff2',
  '.woff': 'font/woff',
  '.ttf': 'font/ttf',
  '.txt': 'text/plain; charset=utf-8',
  '.xml': 'application/xml; charset=utf-8',
};

/**
 * The pages need: their own scripts and styles, KaTeX's fonts, data: images
 * (none today, harmless), fetches of their own JSON. Style attributes stay
 * allowed because KaTeX positions every glyph with inline styles; scripts may
 * come only from files of the site itself.
 */
export const CONTENT_SECURITY_POLICY = [
  "default-src 'none'",
  "script-src 'self'",
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data:",
  "font-src 'self'",
  "connect-src 'self'",
  "base-uri 'none'",
  "form-action 'self'",
  "frame-ancestors 'none'",
].join('; ');

export const SECURITY_HEADERS: Record<string, string> = {
  'x-content-type-options': 'nosniff',
  'content-security-policy': CONTENT_SECURITY_POLICY,
  'referrer-policy': 'no-referrer',
};

export interface RunningServer {
  url: string;
  port: number;
  close(): Promise<void>;
}

/** Maps a request path to a file below root, or null when it would leave root. */
export function resolveRequestPath(root: string, urlPath: string): string | null {
  let decoded: string;
  try {
    decoded = decodeURIComponent(urlPath.split('?')[0].split('#')[0]);
  } catch {
    return null;
  }
  if (decoded.includes('\0')) return null;
  const absoluteRoot = resolve(root);
  const candidate = normalize(join(absoluteRoot, decoded));
  if (candidate !== absoluteRoot && !candidate.startsWith(absoluteRoot + sep)) return null;
  return candidate;
}

async function findFile(path: string): Promise<string | null> {
  for (const candidate of [path, join(path, 'index.html'), `${path}.html`]) {
    try {
      const info = await stat(candidate);
      if (info.isFile()) return candidate;
    } catch {
      // try the next candidate
    }
  }
  return null;
}

export function serveStatic(root: string, port = 0, host = '127.0.0.1'): Promise<RunningServer> {
  const server: Server = createServer(async (request, response) => {
    if (request.method !== 'GET' && request.method !== 'HEAD') {
      response.writeHead(405, { ...SECURITY_HEADERS, allow: 'GET, HEAD', 'content-type': 'text/plain; charset=utf-8' });
      response.end('Method not allowed: this server only reads files.\n');
      return;
    }
    const head = request.method === 'HEAD';
    const path = resolveRequestPath(root, request.url ?? '/');
    const file = path === null ? null : await findFile(path);
    if (file === null) {
      const notFound = await findFile(join(resolve(root), '404.html'));
      response.writeHead(404, { ...SECURITY_HEADERS, 'content-type': CONTENT_TYPES['.html'] });
      response.end(head ? undefined : notFound ? await readFile(notFound) : 'Not found');
      return;
    }
    const body = await readFile(file);
    response.writeHead(200, { ...SECURITY_HEADERS, 'content-type': CONTENT_TYPES[extname(file)] ?? 'application/octet-stream', 'content-length': body.length });
    response.end(head ? undefined : body);
  });
  return new Promise((resolvePromise, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => {
      const address = server.address();
      const actualPort = typeof address === 'object' && address !== null ? address.port : port;
      resolvePromise({
        url: `http://${host}:${actualPort}/`,
        port: actualPort,
        close: () => new Promise((done) => server.close(() => done())),
      });
    });
  });
}

/** Why a server could not listen on port and host right now ("port 4321 on 127.0.0.1 is already in use"), or null when it could. */
export function portProblem(port: number, host: string): Promise<string | null> {
  return new Promise((resolvePromise) => {
    const probe = createServer();
    probe.once('error', (error: NodeJS.ErrnoException) => {
      if (error.code === 'EADDRINUSE') resolvePromise(`port ${port} on ${host} is already in use`);
      else if (error.code === 'EACCES') resolvePromise(`port ${port} on ${host} needs privileges this user does not have`);
      else if (error.code === 'EADDRNOTAVAIL' || error.code === 'ENOTFOUND') resolvePromise(`${host} is not an address of this machine`);
      else resolvePromise(`cannot listen on ${host}:${port}: ${error.message}`);
    });
    probe.listen(port, host, () => probe.close(() => resolvePromise(null)));
  });
}
