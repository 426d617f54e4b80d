/**
 * How each join type is drawn. Colours were picked for this project to stay apart for
 * readers with red-green colour vision deficiency and in greyscale print: the conjoin family
 * in blues of falling darkness, articulation in orange, pair in dark brown. Every type also
 * has its own dash pattern, so the figure reads without colour at all.
 */
export interface JoinStyle {
  label: string;
  colour: string;
  /** SVG stroke-dasharray, or '' for a solid line. */
  dash: string;
  width: number;
}

const known: Record<string, JoinStyle> = {
  'conjoin-fresh': { label: 'Conjoin, fresh break', colour: '#1d4f91', dash: '', width: 1.5 },
  'conjoin-green': { label: 'Conjoin, fresh break', colour: '#1d4f91', dash: '', width: 1.5 },
  'conjoin-dry': { label: 'Conjoin, dry break', colour: '#4a86c5', dash: '7 3', width: 1.5 },
  'conjoin-modern': { label: 'Conjoin, modern break', colour: '#7ea6cf', dash: '1.5 2.5', width: 1.6 },
  conjoin: { label: 'Conjoin, break age unknown', colour: '#0f2f5c', dash: '3 2', width: 1.5 },
  articulation: { label: 'Articulation', colour: '#d0701c', dash: '9 3 2 3', width: 1.5 },
  pair: { label: 'Pair (left and right)', colour: '#6b2a1f', dash: '12 4', width: 1.5 },
};

const spare: Omit<JoinStyle, 'label'>[] = [
  { colour: '#3d3d3d', dash: '4 2 1 2 1 2', width: 1.4 },
  { colour: '#8a6d00', dash: '3 3', width: 1.4 },
  { colour: '#555f8a', dash: '10 2 2 2', width: 1.4 },
];

/** Style of every type present, in a stable order (known types first, then by name). */
export function stylesFor(types: Iterable<string>): Map<string, JoinStyle> {
  const order = Object.keys(known);
  const present = [...new Set(types)].sort((p, q) => {
    const ip = order.indexOf(p);
    const iq = order.indexOf(q);
    if (ip !== -1 || iq !== -1) return (ip === -1 ? 99 : ip) - (iq === -1 ? 99 : iq);
    return p.localeCompare(q);
  });
  const out = new Map<string, JoinStyle>();
  let s = 0;
  for (const t of present) {
    const k = known[t];
    out.set(t, k ?? { label: t, ...spare[s++ % spare.length] });
  }
  return out;
}

/** Stroke attributes of a join type; `width` overrides the line width (legend samples are thicker). */
export function strokeAttrs(style: JoinStyle, width = style.width): string {
  return `stroke="${style.colour}" stroke-width="${width}"${style.dash ? ` stroke-dasharray="${style.dash}"` : ''}`;
}

/** Thinner lines when there are many, so a dense plan stays legible. */
export function lineWidthFor(style: JoinStyle, joinCount: number): number {
  return joinCount > 400 ? Math.round(style.width * 0.7 * 10) / 10 : style.width;
}
