import { randomBytes, timingSafeEqual } from 'node:crypto';
import type { IncomingMessage } from 'node:http';

/** A fresh random token for one run of the server (256 bits, URL-safe). */
export function newToken(): string {
  return randomBytes(32).toString('base64url');
}

/** Constant-time comparison, so the token cannot be guessed byte by byte from timings. */
export function sameToken(given: string | undefined | null, token: string): boolean {
  if (typeof given !== 'string') return false;
  const a = Buffer.from(given);
  const b = Buffer.from(token);
  return a.length === b.length && timingSafeEqual(a, b);
}

/** The cookie that carries the token after the exchange at page load; one name per port. */
export function cookieName(port: number): string {
  return `knitbone_${port}`;
}

export function cookieValue(req: IncomingMessage, name: string): string | undefined {
  const header = req.headers.cookie;
  if (!header) return undefined;
  for (const part of header.split(';')) {
    const eq = part.indexOf('=');
    if (eq < 0) continue;
    if (part.slice(0, eq).trim() === name) return part.slice(eq + 1).trim();
  }
  return undefined;
}

/** True for a connection from this machine's loopback interface. */
export function isLoopback(address: string | undefined): boolean {
  if (!address) return false;
  return address === '::1' || address.startsWith('127.') || address.startsWith('::ffff:127.');
}
