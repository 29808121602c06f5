/**
 * A minimal static file server for the built site (dist/), bound to 127.0.0.1.
 * Used by `strobe site --serve` and by the browser tests; it serves files only
 * from inside the root folder and never lists directories.
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
    const path = resolveRequestPath(root, request.url ?? '/');
    const file = path === null ? null : await findFile(path);
    if (file === null) {
      const notFound = await findFile(join(resolve(root), '404.html'));
      response.writeHead(404, { 'content-type': CONTENT_TYPES['.html'] });
      response.end(notFound ? await readFile(notFound) : 'Not found');
      return;
    }
    response.writeHead(200, { 'content-type': CONTENT_TYPES[extname(file)] ?? 'application/octet-stream' });
    response.end(await readFile(file));
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
