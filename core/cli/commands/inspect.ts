import type { Command } from 'commander';
import { Host } from '../../host/host';
import { printJson } from '../output';

/** knitbone inspect <mesh>: the fragment's figures and its fracture and original faces. */
export function registerInspect(program: Command): void {
  program
    .command('inspect')
    .description("read one mesh file and show its figures and its fracture and original surface faces")
    .argument('<mesh>', 'a .ply, .stl or .obj file')
    .option('--labels <file>', 'write one byte per triangle of the file, in file order: 1 fracture, 0 original')
    .option('--units <units>', 'length unit of the file: mm, cm or m', 'mm')
    .option('--json', 'print JSON')
    .action(async (mesh: string, opts: { labels?: string; units: string; json?: boolean }) => {
      const r = await new Host().call('scans.inspect', { path: mesh, labels: opts.labels, units: opts.units as 'mm' });
      if (opts.json) return printJson(r);
      const out = process.stdout;
      out.write(`${mesh}: ${r.triangles} triangles, area ${r.area.toFixed(1)} mm2, volume ${r.volume.toFixed(1)} mm3, ${r.closed ? 'closed' : 'open'}\n`);
      for (const w of r.warnings) out.write(`  warning: ${w}\n`);
      for (const f of r.faces) {
        const extra = f.kind === 'fracture'
          ? `, width ${f.meanWidth?.toFixed(1)} mm, angle ${f.meanAngleDeg ?? '-'} (${f.angleClass}), outline ${f.outlineClass}, suggests ${f.breakAge?.suggestion}`
          : '';
        out.write(`  face ${f.id}: ${f.surfaceClass}, ${f.area.toFixed(1)} mm2, ${f.triangles} triangles${extra}\n`);
      }
    });
}
