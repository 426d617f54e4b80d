import type { Command } from 'commander';
import { Host } from '../../host/host';
import { printJson } from '../output';
import { terminalProgress } from '../progress';

/** `knitbone match <a-mesh> <b-mesh> [--json]`: align two fragments by their break faces. */
export function registerMatch(program: Command): void {
  program
    .command('match')
    .description("align two fragment scans by their break faces; the transform maps B's file frame into A's (mm)")
    .argument('<a-mesh>', 'scan of fragment A (.ply, .stl or .obj)')
    .argument('<b-mesh>', 'scan of fragment B')
    .option('--units <unit>', 'length unit of both files: mm, cm or m', 'mm')
    .option('--units-b <unit>', 'length unit of B when it differs from A')
    .option('--alternatives <n>', 'how many next-best alignments to list', '4')
    .option('--json', 'print one JSON document')
    .action(async (a: string, b: string, opts: { units: string; unitsB?: string; alternatives: string; json?: boolean }) => {
      const progress = terminalProgress();
      let out;
      try {
        out = await new Host().callUnchecked(
          'proposals.match',
          { a, b, unitsA: opts.units, unitsB: opts.unitsB ?? opts.units, alternatives: Number(opts.alternatives) },
          { onProgress: progress.onProgress },
        );
      } finally {
        progress.finish();
      }
      const r = out as { score: number; transform: number[] | null; faceA: number | null; faceB: number | null; contactFraction: number; gapRmsMm: number | null; penetrationMm: number | null };
      if (opts.json) {
        printJson(out);
        return;
      }
      if (!r.transform) {
        process.stdout.write('no alignment of the break faces was found: these fragments do not appear to join (score 0)\n');
        return;
      }
      const verdict = r.score >= 0.8 ? 'likely join' : r.score >= 0.5 ? 'possible join' : 'unlikely join';
      process.stdout.write(
        `${verdict}: score ${r.score.toFixed(3)} (face ${r.faceA} of A with face ${r.faceB} of B; contact ${(100 * r.contactFraction).toFixed(0)}%, ` +
          `gap RMS ${r.gapRmsMm?.toFixed(2)} mm, penetration ${r.penetrationMm?.toFixed(2)} mm)\n` +
          `transform (B -> A, mm, row-major):\n` +
          [0, 1, 2, 3].map((i) => '  ' + r.transform!.slice(4 * i, 4 * i + 4).map((v) => v.toFixed(5).padStart(12)).join(' ')).join('\n') +
          '\n',
      );
    });
}
