import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Command } from 'commander';
import { KnitboneError } from '../../host/errors';
import { Host } from '../../host/host';
import { printJson } from '../output';

interface SpatialOptions {
  json?: boolean;
  type: string[];
  taxon: string[];
  layer: string[];
  figures?: string;
  png?: boolean;
  sectionBearing?: string;
  sectionWidth?: string;
  sectionOrigin?: string;
  width?: string;
}

const collect = (value: string, previous: string[]) => [...previous, value];

function number(value: string | undefined, option: string): number | undefined {
  if (value === undefined) return undefined;
  const n = Number(value);
  if (value.trim() === '' || !Number.isFinite(n)) throw new KnitboneError('usage', `${option} needs a number, not "${value}"`);
  return n;
}

const share = (v: number | null) => (v === null ? 'n/a' : `${(v * 100).toFixed(1)} %`);
const metres = (v: number | null) => (v === null ? 'n/a' : `${v.toFixed(2)} m`);

/** knitbone spatial <catalogue>: distances, directions and crossings of accepted joins; figures as SVG (and PNG). */
export function registerSpatial(program: Command): void {
  program
    .command('spatial')
    .description('measure how far and which way refitted pieces lie apart, and whether joins cross units, levels and layers')
    .argument('<catalogue>', 'path of the catalogue file')
    .option('--json', 'print the analysis as one JSON document')
    .option('--type <type>', 'only joins of this type (conjoin, conjoin-dry, articulation, pair...); repeatable', collect, [])
    .option('--taxon <taxon>', 'only joins with a specimen of this taxon; repeatable', collect, [])
    .option('--layer <layer>', 'only joins with a specimen in this layer; repeatable', collect, [])
    .option('--figures <dir>', 'also write plan, section, histogram, rose and layer-matrix figures as SVG into this folder')
    .option('--png', 'with --figures, also write PNG copies (needs Chromium)')
    .option('--section-bearing <degrees>', 'direction of the section line, clockwise from grid north (default 90: along x)')
    .option('--section-width <metres>', 'project only what lies within this distance of the section line')
    .option('--section-origin <x,y>', 'a point on the section line (default 0,0)')
    .option('--width <pixels>', 'width of the figures in pixels')
    .action(async (catalogue: string, opts: SpatialOptions) => {
      const host = new Host();
      const filter = { types: opts.type, taxa: opts.taxon, layers: opts.layer };
      const report = await host.call('spatial.analyse', { catalogue, ...filter });
      if (opts.figures) await writeFigures(host, catalogue, filter, opts);
      if (opts.json) return printJson(report);
      const s = report.summary;
      const lines = [
        `${s.count} joins measured (${s.approximateCount} with a position from unit centre and level mid-depth), ${s.excludedCount} left out for want of a position`,
        `horizontal distance: mean ${metres(s.meanHorizontalM)}, median ${metres(s.medianHorizontalM)}, max ${metres(s.maxHorizontalM)}`,
        `vertical displacement: mean ${metres(s.meanVerticalM)}, median ${metres(s.medianVerticalM)}, max ${metres(s.maxVerticalM)}`,
        `crossing units ${share(s.shareCrossingUnit)}, levels ${share(s.shareCrossingLevel)}, layers ${share(s.shareCrossingLayer)}`,
      ];
      const layers = report.layers.filter((l) => report.layerMatrix[l] !== undefined);
      if (layers.length) {
        const w = Math.max(5, ...layers.map((l) => l.length));
        lines.push('', 'joins between layers:', ['layer'.padEnd(w), ...layers.map((l) => l.padStart(w))].join('  '));
        for (const p of layers) lines.push([p.padEnd(w), ...layers.map((q) => String(report.layerMatrix[p][q]).padStart(w))].join('  '));
        lines.push('', 'per layer: joins, share leaving the layer, share crossing levels');
        for (const layer of report.layers) {
          const c = report.perLayer[layer];
          if (!c) continue;
          lines.push(`${layer.padEnd(w)}  ${String(c.joins).padStart(5)}  ${share(c.shareCrossingLayer).padStart(8)}  ${share(c.shareCrossingLevel).padStart(8)}`);
        }
      }
      for (const e of report.excluded.slice(0, 20)) lines.push(`left out: join ${e.id} (${e.a}-${e.b}): ${e.reason}`);
      if (report.excluded.length > 20) lines.push(`... and ${report.excluded.length - 20} more left out (see --json)`);
      process.stdout.write(lines.join('\n') + '\n');
    });
}

async function writeFigures(host: Host, catalogue: string, filter: { types: string[]; taxa: string[]; layers: string[] }, opts: SpatialOptions) {
  const dir = opts.figures as string;
  const width = number(opts.width, '--width');
  const bearing = number(opts.sectionBearing, '--section-bearing') ?? 90;
  const halfWidth = number(opts.sectionWidth, '--section-width');
  let origin: { x: number; y: number } | undefined;
  if (opts.sectionOrigin !== undefined) {
    const parts = opts.sectionOrigin.split(',').map((p) => Number(p.trim()));
    if (parts.length !== 2 || parts.some((p) => !Number.isFinite(p))) throw new KnitboneError('usage', `--section-origin needs x,y in metres, not "${opts.sectionOrigin}"`);
    origin = { x: parts[0], y: parts[1] };
  }
  const kinds = ['plan', 'section', 'histogram', 'rose', 'layers'] as const;
  const svgs: string[] = [];
  for (const kind of kinds) {
    const r = await host.call('spatial.figure', {
      catalogue,
      kind,
      ...filter,
      width,
      section: kind === 'section' ? { bearingDeg: bearing, halfWidthM: halfWidth, origin } : undefined,
    });
    svgs.push(r.svg);
  }
  mkdirSync(dir, { recursive: true });
  kinds.forEach((k, i) => writeFileSync(join(dir, `refits-${k}.svg`), svgs[i]));
  if (opts.png) {
    const { svgToPng } = await import('../../host/svg-to-png');
    const pngs = await svgToPng(svgs, 2);
    kinds.forEach((k, i) => writeFileSync(join(dir, `refits-${k}.png`), pngs[i]));
  }
  process.stderr.write(`wrote ${kinds.length} figures${opts.png ? ' (SVG and PNG)' : ''} to ${dir}\n`);
}
