import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { KnitboneError } from '../errors';
import { Host } from '../host';
import type { ProgressEvent } from '../request';
import { requests } from '../requests/index';
import type { ShellSession } from '../session';
import { errorBody, sendError, sendJson, sendRefusal } from './answer';
import { RENDERER_CSP, SECURITY_HEADERS } from './csp';
import { RendererFiles } from './static-files';
import { cookieName, cookieValue, isLoopback, newToken, sameToken } from './token';

/**
 * The loopback shell: the renderer and the host API over HTTP on 127.0.0.1 only.
 *
 * Every request must carry this run's random token. The page gets it once: the printed
 * address has `?token=...`, which is exchanged for an HttpOnly, SameSite=Strict cookie and a
 * redirect to a clean URL; the served index.html carries the token in a meta tag so the page
 * can send it as the `X-Knitbone-Token` header. API calls need the header (a cookie alone is
 * not enough, so another page on this machine cannot call the API through the browser).
 * No CORS headers are ever sent; the Host header must name this server (DNS rebinding).
 *
 *   GET  /?token=T            token exchange
 *   GET  /, /assets/...       the built renderer, with the CSP header
 *   GET  /api/session         ShellSession
 *   POST /api/call/<name>     body = the request's input (JSON); answer {ok, result} or
 *                             {ok: false, error: {kind, problems}}; with
 *                             `Accept: text/event-stream` progress streams as SSE events
 *                             `progress`, then one `result` or `error`.
 */
export interface LoopbackOptions {
  host?: Host;
  /** Folder of the built renderer (renderer/dist). */
  rendererDir: string;
  session: () => Omit<ShellSession, 'requests'>;
  /** 0 or undefined: any free port. */
  port?: number;
  token?: string;
  /** Largest request body accepted; default 64 MB (a specimen CSV sent as text). */
  maxBodyBytes?: number;
}

export interface LoopbackServer {
  port: number;
  token: string;
  /** http://127.0.0.1:P/ */
  origin: string;
  /** The address to open: origin with the token to exchange. */
  url: string;
  close(): Promise<void>;
}

export const TOKEN_HEADER = 'x-knitbone-token';

export async function startLoopbackServer(options: LoopbackOptions): Promise<LoopbackServer> {
  const host = options.host ?? new Host();
  const token = options.token ?? newToken();
  const files = new RendererFiles(options.rendererDir);
  const maxBody = options.maxBodyBytes ?? 64 * 1024 * 1024;
  let port = 0;

  const server = createServer((req, res) => {
    handle(req, res).catch((err) => {
      if (!res.headersSent) sendError(res, err);
      else res.destroy();
    });
  });

  async function handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    if (!isLoopback(req.socket.remoteAddress)) {
      return sendRefusal(res, 403, 'refused', 'this server answers only this computer (127.0.0.1)');
    }
    const hostHeader = req.headers.host ?? '';
    if (hostHeader !== `127.0.0.1:${port}` && hostHeader !== `localhost:${port}`) {
      return sendRefusal(res, 403, 'refused', `unexpected Host header "${hostHeader}"; open http://127.0.0.1:${port}/`);
    }
    const url = new URL(req.url ?? '/', `http://127.0.0.1:${port}`);
    const method = req.method ?? 'GET';

    // Token exchange at page load.
    if (method === 'GET' && url.pathname === '/' && url.searchParams.has('token')) {
      if (!sameToken(url.searchParams.get('token'), token)) {
        return sendRefusal(res, 401, 'refused', 'wrong token; use the address knitbone printed when it started');
      }
      res.writeHead(303, {
        ...SECURITY_HEADERS,
        Location: '/',
        'Set-Cookie': `${cookieName(port)}=${token}; HttpOnly; SameSite=Strict; Path=/`,
      });
      return void res.end();
    }

    const headerToken = req.headers[TOKEN_HEADER];
    const byHeader = sameToken(Array.isArray(headerToken) ? headerToken[0] : headerToken, token);
    const byCookie = sameToken(cookieValue(req, cookieName(port)), token);
    if (!byHeader && !byCookie) {
      return sendRefusal(res, 401, 'refused', 'missing or wrong token; use the address knitbone printed when it started');
    }

    if (url.pathname.startsWith('/api/')) {
      if (!byHeader) {
        return sendRefusal(res, 401, 'refused', `API requests must carry the token in the ${TOKEN_HEADER} header`);
      }
      if (url.pathname === '/api/session' && method === 'GET') {
        return sendJson(res, 200, { ok: true, result: sessionInfo() });
      }
      const m = /^\/api\/call\/([a-z][a-zA-Z0-9.-]*)$/.exec(url.pathname);
      if (m) {
        if (method !== 'POST') return sendRefusal(res, 405, 'usage', 'host requests are sent with POST');
        return call(m[1], req, res);
      }
      return sendRefusal(res, 404, 'not-found', `no API route ${url.pathname}`);
    }

    if (method !== 'GET' && method !== 'HEAD') {
      return sendRefusal(res, 405, 'usage', `${method} is not answered here`);
    }
    if (!files.built) {
      return sendRefusal(res, 503, 'internal', 'the renderer is not built; run `npm start` or `npx vite build --config renderer/vite.config.ts`');
    }
    if (url.pathname === '/' || url.pathname === '/index.html') {
      const html = files.indexHtml(token);
      res.writeHead(200, {
        ...SECURITY_HEADERS,
        'Content-Security-Policy': RENDERER_CSP,
        'Content-Type': 'text/html; charset=utf-8',
        'Content-Length': String(Buffer.byteLength(html)),
      });
      return void res.end(method === 'HEAD' ? undefined : html);
    }
    const file = files.resolve(url.pathname);
    if (!file) return sendRefusal(res, 404, 'not-found', `no file ${url.pathname}`);
    files.send(res, file, { ...SECURITY_HEADERS, 'Content-Security-Policy': RENDERER_CSP });
  }

  function sessionInfo(): ShellSession {
    const list = Host.requestNames().map((name) => ({ name, summary: (requests[name] as { summary: string }).summary }));
    return { ...options.session(), requests: list };
  }

  async function call(name: string, req: IncomingMessage, res: ServerResponse): Promise<void> {
    const type = (req.headers['content-type'] ?? '').split(';')[0].trim();
    if (type !== 'application/json') {
      return sendRefusal(res, 415, 'bad-input', 'send the request input as JSON (Content-Type: application/json)');
    }
    let input: unknown;
    try {
      input = await readJson(req, maxBody);
    } catch (err) {
      return sendError(res, err);
    }
    const abort = new AbortController();
    res.on('close', () => {
      if (!res.writableFinished) abort.abort();
    });
    const wantsStream = (req.headers.accept ?? '').includes('text/event-stream');
    if (!wantsStream) {
      try {
        const result = await host.callUnchecked(name, input, { signal: abort.signal });
        return sendJson(res, 200, { ok: true, result: result ?? null });
      } catch (err) {
        return sendError(res, err);
      }
    }
    res.writeHead(200, {
      ...SECURITY_HEADERS,
      'Content-Type': 'text/event-stream; charset=utf-8',
      Connection: 'keep-alive',
    });
    const send = (event: string, data: unknown): void => {
      res.write(`event: ${event}\ndata: ${JSON.stringify(data)}\n\n`);
    };
    let last = 0;
    const onProgress = (e: ProgressEvent): void => {
      const now = Date.now();
      if (now - last < 50 && e.done < e.total) return;
      last = now;
      send('progress', e);
    };
    try {
      const result = await host.callUnchecked(name, input, { signal: abort.signal, onProgress });
      send('result', { ok: true, result: result ?? null });
    } catch (err) {
      send('error', errorBody(err));
    }
    res.end();
  }

  await new Promise<void>((resolveListen, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, '127.0.0.1', () => resolveListen());
  });
  port = (server.address() as AddressInfo).port;
  const origin = `http://127.0.0.1:${port}`;
  return {
    port,
    token,
    origin,
    url: `${origin}/?token=${token}`,
    close: () =>
      new Promise<void>((done) => {
        server.closeAllConnections();
        server.close(() => done());
      }),
  };
}

function readJson(req: IncomingMessage, limit: number): Promise<unknown> {
  return new Promise((resolveBody, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    let failed = false;
    req.on('data', (chunk: Buffer) => {
      if (failed) return;
      size += chunk.length;
      if (size > limit) {
        failed = true;
        reject(new KnitboneError('bad-input', `the request body is larger than ${Math.round(limit / 1048576)} MB`));
        req.resume();
        return;
      }
      chunks.push(chunk);
    });
    req.on('end', () => {
      if (failed) return;
      const text = Buffer.concat(chunks).toString('utf8');
      if (text.trim() === '') return resolveBody({});
      try {
        resolveBody(JSON.parse(text));
      } catch (err) {
        reject(new KnitboneError('bad-input', `the request body is not valid JSON (${(err as Error).message})`));
      }
    });
    req.on('error', reject);
  });
}
