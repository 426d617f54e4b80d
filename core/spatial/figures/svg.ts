/**
 * Small helpers for writing SVG as text. Figures are plain strings so they can be built
 * anywhere (worker, CLI, renderer) and saved, printed or rasterised as they are.
 */

/** Escape text for element content and attribute values. */
export function esc(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] as string);
}

/** A pixel coordinate with at most one decimal: enough for print, small in the file. */
export function px(v: number): string {
  const r = Math.round(v * 10) / 10;
  return Object.is(r, -0) ? '0' : String(r);
}

/** A number for a label: the shortest of its values rounded to `places` decimals. */
export function label(v: number, places = 2): string {
  const f = 10 ** places;
  const r = Math.round(v * f) / f;
  return (Object.is(r, -0) ? 0 : r).toLocaleString('en-GB', { maximumFractionDigits: places });
}

export const FONT = "font-family=\"'DejaVu Sans', 'Liberation Sans', Arial, sans-serif\"";
export const INK = '#1a1a1a';
export const MUTED = '#5c5c5c';

/** Open an SVG document of the given size in pixels, with a title and description for readers. */
export function svgOpen(width: number, height: number, title: string, description: string): string {
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" width="${px(width)}" height="${px(height)}" ` +
    `viewBox="0 0 ${px(width)} ${px(height)}" ${FONT} font-size="12" fill="${INK}">` +
    `<title>${esc(title)}</title><desc>${esc(description)}</desc>` +
    `<rect width="100%" height="100%" fill="#ffffff"/>`
  );
}

export function text(x: number, y: number, content: string, attrs = ''): string {
  return `<text x="${px(x)}" y="${px(y)}"${attrs ? ' ' + attrs : ''}>${esc(content)}</text>`;
}

/** Figure title at the top left. */
export function heading(x: number, y: number, title: string, subtitle?: string): string {
  let out = text(x, y, title, 'font-size="15" font-weight="bold"');
  if (subtitle) out += text(x, y + 17, subtitle, `font-size="12" fill="${MUTED}"`);
  return out;
}
