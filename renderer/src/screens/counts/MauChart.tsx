import { forwardRef } from 'react';
import type { ElementTally } from './counts-model';

/**
 * %MAU by element for one taxon, recorded and refitted bars side by side (Binford 1984:
 * %MAU = MAU / largest MAU x 100). Drawn as SVG so it exports as a figure unchanged.
 * Colours come from attributes, not CSS, so the exported file looks the same on its own.
 */
export const MauChart = forwardRef<SVGSVGElement, {
  taxon: string;
  recorded: ElementTally[];
  refitted: ElementTally[];
  colours: { ink: string; muted: string; recorded: string; refitted: string; grid: string; background: string };
}>(function MauChart({ taxon, recorded, refitted, colours }, ref) {
  const elements = [...new Set([...refitted, ...recorded].filter((e) => e.taxon === taxon).map((e) => e.element))].sort();
  const value = (list: ElementTally[], el: string): number | null =>
    list.find((e) => e.taxon === taxon && e.element === el)?.percentMau ?? null;
  const labelWidth = 150;
  const plotWidth = 460;
  const barH = 11;
  const groupH = barH * 2 + 12;
  const top = 46;
  const height = top + elements.length * groupH + 44;
  const width = labelWidth + plotWidth + 60;
  const x = (v: number): number => labelWidth + (v / 100) * plotWidth;
  return (
    <svg
      ref={ref}
      xmlns="http://www.w3.org/2000/svg"
      viewBox={`0 0 ${width} ${height}`}
      width={width}
      height={height}
      role="img"
      aria-label={`%MAU by element for ${taxon}, recorded and refitted`}
      fontFamily="DejaVu Sans, Noto Sans, sans-serif"
      fontSize="12"
    >
      <rect width={width} height={height} fill={colours.background} />
      <text x={8} y={18} fill={colours.ink} fontSize="14" fontWeight="600">
        %MAU, {taxon}
      </text>
      <rect x={labelWidth} y={26} width={10} height={10} fill={colours.recorded} />
      <text x={labelWidth + 14} y={35} fill={colours.muted}>as recorded</text>
      <rect x={labelWidth + 100} y={26} width={10} height={10} fill={colours.refitted} />
      <text x={labelWidth + 114} y={35} fill={colours.muted}>with refits</text>
      {[0, 25, 50, 75, 100].map((t) => (
        <g key={t}>
          <line x1={x(t)} x2={x(t)} y1={top - 4} y2={height - 30} stroke={colours.grid} strokeWidth={1} />
          <text x={x(t)} y={height - 16} fill={colours.muted} textAnchor="middle">
            {t}
          </text>
        </g>
      ))}
      <text x={labelWidth + plotWidth / 2} y={height - 2} fill={colours.muted} textAnchor="middle">
        %MAU
      </text>
      {elements.map((el, i) => {
        const y = top + i * groupH;
        const r = value(recorded, el);
        const f = value(refitted, el);
        return (
          <g key={el}>
            <text x={labelWidth - 8} y={y + barH + 4} fill={colours.ink} textAnchor="end">
              {el}
            </text>
            <rect x={labelWidth} y={y} width={Math.max(0, x(r ?? 0) - labelWidth)} height={barH} fill={colours.recorded}>
              <title>{`${el} as recorded: ${r ?? 'n/a'}`}</title>
            </rect>
            <text x={x(r ?? 0) + 4} y={y + barH - 1} fill={colours.muted} fontSize="10">
              {r ?? 'n/a'}
            </text>
            <rect x={labelWidth} y={y + barH + 2} width={Math.max(0, x(f ?? 0) - labelWidth)} height={barH} fill={colours.refitted}>
              <title>{`${el} with refits: ${f ?? 'n/a'}`}</title>
            </rect>
            <text x={x(f ?? 0) + 4} y={y + 2 * barH + 1} fill={colours.ink} fontSize="10">
              {f ?? 'n/a'}
            </text>
          </g>
        );
      })}
    </svg>
  );
});
