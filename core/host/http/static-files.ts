import { createReadStream, existsSync, readFileSync, statSync } from 'node:fs';
import type { ServerResponse } from 'node:http';
import { extname, join, normalize, resolve, sep } from 'node:path';

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.woff2': 'font/woff2',
  '.ico': 'image/x-icon',
  '.txt': 'text/plain; charset=utf-8',
};

/**
 * The built renderer (renderer/dist). Files are looked up strictly below the folder:
 * a path that normalises outside it is not found.
 */
export class RendererFiles {
  constructor(readonly root: string) {}

  get built(): boolean {
    return existsSync(join(this.root, 'index.html'));
  }

  /** index.html with the run's token placed in a meta tag the page reads at load. */
  indexHtml(token: string): string {
    const html = readFileSync(join(this.root, 'index.html'), 'utf8');
    const meta = `<meta name="knitbone-token" content="${token}">`;
    return html.replace('<head>', `<head>\n    ${meta}`);
  }

  /** Resolve a URL path to a file under the root, or null. */
  resolve(urlPath: string): string | null {
    let decoded: string;
    try {
      decoded = decodeURIComponent(urlPath);
    } catch {
      return null;
    }
    if (decoded.includes('\0')) return null;
    const full = resolve(this.root, '.' + normalize('/' + decoded));
    if (!full.startsWith(resolve(this.root) + sep)) return null;
    if (!existsSync(full) || !statSync(full).isFile()) return null;
    return full;
  }

  send(res: ServerResponse, file: string, headers: Record<string, string>): void {
    res.writeHead(200, {
      ...headers,
      'Content-Type': TYPES[extname(file)] ?? 'application/octet-stream',
      'Content-Length': String(statSync(file).size),
    });
    createReadStream(file).pipe(res);
  }
}
