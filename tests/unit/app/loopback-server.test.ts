import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { request as httpRequest } from 'node:http';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { networkInterfaces, tmpdir } from 'node:os';
import { join } from 'node:path';
import { startLoopbackServer, type LoopbackServer } from '../../../core/host/http/server';
import { isLoopback, sameToken } from '../../../core/host/http/token';

// The loopback shell's security contract (issue 7): 127.0.0.1 only, a per-run token on
// every request, no CORS, clear JSON errors, the renderer served with its CSP. The
// requirements follow the OWASP guidance on CSRF (custom request headers) and on DNS
// rebinding (check the Host header); the status codes are those of RFC 9110.

let server: LoopbackServer;
let dir: string;

interface Answer {
  status: number;
  headers: Record<string, string | string[] | undefined>;
  body: string;
}

function send(path: string, init: { method?: string; headers?: Record<string, string>; body?: string; port?: number; host?: string } = {}): Promise<Answer> {
  return new Promise((resolve, reject) => {
    const req = httpRequest(
      { host: init.host ?? '127.0.0.1', port: init.port ?? server.port, path, method: init.method ?? 'GET', headers: init.headers },
      (res) => {
        let body = '';
        res.setEncoding('utf8');
        res.on('data', (c: string) => (body += c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body }));
      },
    );
    req.on('error', reject);
    if (init.body !== undefined) req.write(init.body);
    req.end();
  });
}

const withToken = (extra: Record<string, string> = {}) => ({ 'X-Knitbone-Token': server.token, ...extra });
const json = (extra: Record<string, string> = {}) => withToken({ 'Content-Type': 'application/json', ...extra });

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'knitbone-http-'));
  writeFileSync(join(dir, 'index.html'), '<!doctype html><html><head><title>t</title></head><body></body></html>');
  writeFileSync(join(dir, 'app.js'), 'console.log(1)');
  server = await startLoopbackServer({
    rendererDir: dir,
    maxBodyBytes: 1024,
    session: () => ({ catalogue: null, demoCatalogue: null, recent: [], canPickFiles: false }),
  });
});

afterAll(async () => {
  await server.close();
});

describe('loopback server: who may talk to it', () => {
  it('listens on 127.0.0.1 and prints an address with a long random token', () => {
    expect(server.url).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/\?token=[A-Za-z0-9_-]{43}$/);
  });

  it('refuses the page, files and API without the token', async () => {
    for (const path of ['/', '/app.js', '/api/session']) {
      const r = await send(path);
      expect(r.status, path).toBe(401);
      expect(JSON.parse(r.body).error.kind).toBe('refused');
    }
    const call = await send('/api/call/app.about', { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: '{}' });
    expect(call.status).toBe(401);
  });

  it('refuses a wrong token of the right length', async () => {
    const wrong = server.token.slice(0, -1) + (server.token.endsWith('A') ? 'B' : 'A');
    expect((await send(`/?token=${wrong}`)).status).toBe(401);
    expect((await send('/api/session', { headers: { 'X-Knitbone-Token': wrong } })).status).toBe(401);
  });

  it('exchanges the token for an HttpOnly SameSite=Strict cookie, which opens the page but not the API', async () => {
    const r = await send(`/?token=${server.token}`);
    expect(r.status).toBe(303);
    expect(r.headers.location).toBe('/');
    const cookie = String(r.headers['set-cookie']);
    expect(cookie).toContain('HttpOnly');
    expect(cookie).toContain('SameSite=Strict');
    const pair = cookie.split(';')[0];
    const page = await send('/', { headers: { Cookie: pair } });
    expect(page.status).toBe(200);
    expect(page.body).toContain(`<meta name="knitbone-token" content="${server.token}">`);
    const api = await send('/api/session', { headers: { Cookie: pair } });
    expect(api.status).toBe(401);
    expect(JSON.parse(api.body).error.problems[0].message).toContain('X-Knitbone-Token'.toLowerCase());
  });

  it('refuses a Host header that is not this server (DNS rebinding)', async () => {
    const r = await send('/api/session', { headers: withToken({ Host: `attacker.example:${server.port}` }) });
    expect(r.status).toBe(403);
  });

  it('is not reachable on the other interfaces of this machine', async () => {
    const others = Object.values(networkInterfaces())
      .flat()
      .filter((a) => a && a.family === 'IPv4' && !a.internal)
      .map((a) => a!.address);
    for (const address of others) {
      await expect(send('/', { host: address })).rejects.toMatchObject({ code: 'ECONNREFUSED' });
    }
    // The check inside the server, for connections that reach it some other way.
    expect(isLoopback('127.0.0.1')).toBe(true);
    expect(isLoopback('::1')).toBe(true);
    expect(isLoopback('::ffff:127.0.0.1')).toBe(true);
    expect(isLoopback('192.168.1.20')).toBe(false);
    expect(isLoopback('::ffff:10.0.0.1')).toBe(false);
    expect(isLoopback(undefined)).toBe(false);
  });

  it('compares tokens exactly', () => {
    expect(sameToken('abc', 'abc')).toBe(true);
    expect(sameToken('abd', 'abc')).toBe(false);
    expect(sameToken('ab', 'abc')).toBe(false);
    expect(sameToken(undefined, 'abc')).toBe(false);
  });

  it('sends no CORS headers, even to a preflight', async () => {
    const pre = await send('/api/call/app.about', {
      method: 'OPTIONS',
      headers: { Origin: 'http://evil.example', 'Access-Control-Request-Method': 'POST' },
    });
    expect(pre.status).toBe(401);
    expect(pre.headers['access-control-allow-origin']).toBeUndefined();
    const ok = await send('/api/call/app.about', { method: 'POST', headers: json({ Origin: 'http://evil.example' }), body: '{}' });
    expect(ok.headers['access-control-allow-origin']).toBeUndefined();
  });
});

describe('loopback server: requests and answers', () => {
  it('answers a host request with its result', async () => {
    const r = await send('/api/call/app.about', { method: 'POST', headers: json(), body: '{}' });
    expect(r.status).toBe(200);
    expect(JSON.parse(r.body)).toEqual({ ok: true, result: { name: 'knitbone', version: expect.any(String) } });
  });

  it('lists the host requests in the session', async () => {
    const r = await send('/api/session', { headers: withToken() });
    const body = JSON.parse(r.body);
    expect(body.result.requests).toContainEqual({ name: 'app.about', summary: expect.any(String) });
  });

  it('answers malformed JSON with a clear error', async () => {
    const r = await send('/api/call/app.about', { method: 'POST', headers: json(), body: '{"a":' });
    expect(r.status).toBe(400);
    const body = JSON.parse(r.body);
    expect(body.ok).toBe(false);
    expect(body.error.kind).toBe('bad-input');
    expect(body.error.problems[0].message).toMatch(/not valid JSON/);
  });

  it('names the field of input that does not fit the request', async () => {
    const r = await send('/api/call/app.about', { method: 'POST', headers: json(), body: '{"surprise": 1}' });
    expect(r.status).toBe(400);
    const body = JSON.parse(r.body);
    expect(body.error.problems.length).toBeGreaterThan(0);
    expect(JSON.stringify(body.error.problems)).toContain('surprise');
  });

  it('refuses an unknown request, a wrong method, a wrong content type and an oversize body', async () => {
    const unknown = await send('/api/call/no.such', { method: 'POST', headers: json(), body: '{}' });
    expect(unknown.status).toBe(400);
    expect(JSON.parse(unknown.body).error.problems[0].message).toContain('unknown request "no.such"');
    expect((await send('/api/call/app.about', { headers: withToken() })).status).toBe(405);
    expect((await send('/api/call/app.about', { method: 'POST', headers: withToken({ 'Content-Type': 'text/plain' }), body: '{}' })).status).toBe(415);
    const big = await send('/api/call/app.about', { method: 'POST', headers: json(), body: JSON.stringify({ x: 'y'.repeat(2000) }) });
    expect(big.status).toBe(400);
    expect(JSON.parse(big.body).error.problems[0].message).toMatch(/larger than/);
  });

  it('streams progress as server-sent events ending in one result', async () => {
    const r = await send('/api/call/app.about', { method: 'POST', headers: json({ Accept: 'text/event-stream' }), body: '{}' });
    expect(r.headers['content-type']).toContain('text/event-stream');
    expect(r.body).toMatch(/^event: result\ndata: \{"ok":true,"result":\{"name":"knitbone"/m);
  });
});

describe('loopback server: the renderer files', () => {
  it('serves the page with a strict CSP and the other security headers', async () => {
    const r = await send('/', { headers: withToken() });
    const csp = String(r.headers['content-security-policy']);
    expect(csp).toContain("default-src 'none'");
    expect(csp).toMatch(/script-src 'self'(;|$)/);
    expect(csp).not.toContain('unsafe-eval');
    expect(csp).not.toContain('unsafe-inline');
    expect(csp).toContain("frame-ancestors 'none'");
    expect(r.headers['x-content-type-options']).toBe('nosniff');
    const js = await send('/app.js', { headers: withToken() });
    expect(js.status).toBe(200);
    expect(js.headers['content-type']).toContain('text/javascript');
  });

  it('never serves a file outside the renderer folder', async () => {
    for (const path of ['/../package.json', '/%2e%2e/%2e%2e/package.json', '/..%2f..%2fpackage.json', '/%00']) {
      const r = await send(path, { headers: withToken() });
      expect(r.status, path).toBe(404);
    }
  });
});
