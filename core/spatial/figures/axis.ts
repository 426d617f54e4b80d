import { esc, label, MUTED, px, text } from './svg';

/** A linear map from data values to pixels. */
export interface LinearScale {
  (v: number): number;
  domain: [number, number];
  range: [number, number];
}

export function linearScale(domain: [number, number], range: [number, number]): LinearScale {
  const [d0, d1] = domain;
  const [r0, r1] = range;
  const k = d1 === d0 ? 0 : (r1 - r0) / (d1 - d0);
  const f = ((v: number) => r0 + (v - d0) * k) as LinearScale;
  f.domain = domain;
  f.range = range;
  return f;
}

/** A round step (1, 2 or 5 times a power of ten) giving about `target` intervals over `span`. */
export function niceStep(span: number, target: number): number {
  if (!(span > 0) || !Number.isFinite(span)) return 1;
  const raw = span / Math.max(1, target);
  const power = 10 ** Math.floor(Math.log10(raw));
  const m = raw / power;
  // Round to the nearest of 1, 2, 5, 10 on a logarithmic scale (the cut points are the
  // geometric means sqrt(2), sqrt(10), sqrt(50)), so the interval count stays near the target.
  const nice = m >= Math.sqrt(50) ? 10 : m >= Math.sqrt(10) ? 5 : m >= Math.SQRT2 ? 2 : 1;
  return nice * power;
}

/** The round values from lo to hi at `step` (inclusive where they fall inside). */
export function ticks(lo: number, hi: number, step: number): number[] {
  const out: number[] = [];
  const first = Math.ceil(lo / step - 1e-9);
  const last = Math.floor(hi / step + 1e-9);
  for (let i = first; i <= last && out.length < 200; i++) out.push(Math.round(i * step * 1e9) / 1e9);
  return out;
}

/** Decimal places needed to print multiples of `step` without noise. */
export function placesFor(step: number): number {
  return Math.max(0, Math.min(6, -Math.floor(Math.log10(step) + 1e-9)));
}

/** A horizontal axis along y = `at`, with ticks, tick labels and a title below. */
export function bottomAxis(scale: LinearScale, at: number, step: number, title: string): string {
  const [x0, x1] = scale.range;
  let path = `M${px(x0)} ${px(at)}H${px(x1)}`;
  let labels = '';
  const places = placesFor(step);
  for (const t of ticks(scale.domain[0], scale.domain[1], step)) {
    const x = scale(t);
    path += `M${px(x)} ${px(at)}v5`;
    labels += text(x, at + 18, label(t, places), 'text-anchor="middle"');
  }
  return (
    `<g><path d="${path}" stroke="${MUTED}" fill="none"/>${labels}` +
    text((x0 + x1) / 2, at + 38, title, 'text-anchor="middle" font-size="13"') +
    `</g>`
  );
}

/** A vertical axis along x = `at`, with ticks, tick labels and a rotated title at the left. */
export function leftAxis(scale: LinearScale, at: number, step: number, title: string): string {
  const [y0, y1] = scale.range;
  let path = `M${px(at)} ${px(y0)}V${px(y1)}`;
  let labels = '';
  const places = placesFor(step);
  for (const t of ticks(scale.domain[0], scale.domain[1], step)) {
    const y = scale(t);
    path += `M${px(at)} ${px(y)}h-5`;
    labels += text(at - 8, y + 4, label(t, places), 'text-anchor="end"');
  }
  const mid = (y0 + y1) / 2;
  return (
    `<g><path d="${path}" stroke="${MUTED}" fill="none"/>${labels}` +
    `<text x="0" y="0" transform="translate(${px(at - 52)} ${px(mid)}) rotate(-90)" text-anchor="middle" font-size="13">${esc(title)}</text>` +
    `</g>`
  );
}
