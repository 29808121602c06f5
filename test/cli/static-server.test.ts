// The static server behind `strobe site --serve` and the browser tests: it must
// never serve a file outside its root (path traversal is the classic hole of
// hand-written static servers, common practice to test).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { request } from 'node:http';
import { resolveRequestPath, serveStatic, type RunningServer } from '../../src/cli/static-server.ts';

function get(url: string, rawPath: string, method = 'GET'): Promise<{ status: number; body: string; type: string; headers: Record<string, unknown> }> {
  const { hostname, port } = new URL(url);
  return new Promise((resolve, reject) => {
    const req = request({ hostname, port, path: rawPath, method }, (res) => {
      let body = '';
      res.on('data', (chunk) => (body += chunk));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body, type: String(res.headers['content-type'] ?? ''), headers: res.headers }));
    });
    req.on('error', reject);
    req.end();
  });
}

describe('static server', () => {
  const parent = mkdtempSync(join(tmpdir(), 'strobe-serve-'));
  const root = join(parent, 'site');
  let server: RunningServer;

  beforeAll(async () => {
    mkdirSync(join(root, 'models', 'a'), { recursive: true });
    writeFileSync(join(root, 'index.html'), '<p>home</p>');
    writeFileSync(join(root, 'models', 'a', 'index.html'), '<p>model a</p>');
    writeFileSync(join(root, 'data.json'), '{"x":1}');
    writeFileSync(join(root, '404.html'), '<p>missing</p>');
    writeFileSync(join(parent, 'secret.txt'), 'do not serve');
    server = await serveStatic(root, 0);
  });
  afterAll(() => server.close());

  it('binds to 127.0.0.1 and serves files and folder indexes with their content types', async () => {
    expect(server.url).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/$/);
    expect(await get(server.url, '/')).toMatchObject({ status: 200, body: '<p>home</p>' });
    expect(await get(server.url, '/models/a/')).toMatchObject({ status: 200, body: '<p>model a</p>' });
    const json = await get(server.url, '/data.json');
    expect(json.type).toContain('application/json');
  });

  it('answers 404 with the site page for missing files', async () => {
    expect(await get(server.url, '/nope')).toMatchObject({ status: 404, body: '<p>missing</p>' });
  });

  it('never leaves the root, however the path is written', async () => {
    for (const attack of ['/../secret.txt', '/%2e%2e/secret.txt', '/models/../../secret.txt', '/..%2fsecret.txt', '/%00']) {
      const response = await get(server.url, attack);
      expect(response.body).not.toContain('do not serve');
    }
    expect(resolveRequestPath(root, '/../secret.txt')).toBeNull();
    expect(resolveRequestPath(root, '/models/a/')).toBe(join(root, 'models', 'a') + '/');
    expect(resolveRequestPath(root, '/%2e%2e/%2e%2e/etc/passwd')).toBeNull();
    expect(resolveRequestPath(root, '/%E0%A4%A')).toBeNull();
  });

  it('answers only GET and HEAD: other methods get 405 with Allow, and change nothing', async () => {
    for (const method of ['POST', 'PUT', 'DELETE', 'PATCH']) {
      const response = await get(server.url, '/index.html', method);
      expect(response.status, method).toBe(405);
      expect(response.headers.allow).toBe('GET, HEAD');
    }
    const head = await get(server.url, '/index.html', 'HEAD');
    expect(head).toMatchObject({ status: 200, body: '' });
    expect(head.headers['content-length']).toBe(String('<p>home</p>'.length));
    expect((await get(server.url, '/index.html')).body).toBe('<p>home</p>');
  });

  it('sends nosniff and a Content-Security-Policy that allows scripts from the site only', async () => {
    for (const path of ['/', '/nope']) {
      const { headers } = await get(server.url, path);
      expect(headers['x-content-type-options']).toBe('nosniff');
      const csp = String(headers['content-security-policy']);
      expect(csp).toContain("script-src 'self'");
      expect(csp).toContain("default-src 'none'");
      expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/);
    }
  });
});
