/**
 * The Content-Security-Policy of the renderer, the same for both shells (the loopback
 * server sends it as a header, Electron's app protocol sends it on every file, and the
 * built index.html carries it as a meta tag too). No inline script, no eval, no remote
 * content: everything comes from the app's own origin. WebGL needs nothing extra; blob:
 * and data: images allow exporting a chart as PNG.
 */
export const RENDERER_CSP = [
  "default-src 'none'",
  "script-src 'self'",
  "style-src 'self'",
  "img-src 'self' data: blob:",
  "font-src 'self'",
  "connect-src 'self'",
  "worker-src 'self' blob:",
  "base-uri 'none'",
  "form-action 'none'",
  "frame-ancestors 'none'",
  "object-src 'none'",
].join('; ');

/** Headers sent with every response of the loopback server. */
export const SECURITY_HEADERS: Record<string, string> = {
  'X-Content-Type-Options': 'nosniff',
  'Referrer-Policy': 'no-referrer',
  'X-Frame-Options': 'DENY',
  'Cross-Origin-Opener-Policy': 'same-origin',
  'Cross-Origin-Resource-Policy': 'same-origin',
  'Cache-Control': 'no-store',
};
