import { createHash } from 'node:crypto';
import { createReadStream, existsSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import { basename, dirname, extname, isAbsolute, join, relative, resolve } from 'node:path';
import { z } from 'zod';
import { withCatalogue } from '../../catalogue/catalogue';
import { analysisSettingsSchema } from '../../geometry/settings';
import { MESH_EXTENSIONS } from '../../geometry/parse/index';
import { cacheDirFor } from '../../jobs/fragment-cache';
import { analyseScanFile, ScanFileFailure, type ScanFileJob, type ScanFileProblem, type ScanFileResult } from '../../jobs/analyse-scan-file';
import { runInWorkerPool } from '../../jobs/worker-pool';
import { describeForMatching } from '../proposals/describe-faces';
import { KnitboneError, type Problem } from '../errors';
import { defineRequest } from '../request';

/** Version of the scan analysis recorded with every stored result. */
export const SCAN_ANALYSIS_VERSION = 'scans-1';

const units = z.enum(['mm', 'cm', 'm']).default('mm');
const settings = analysisSettingsSchema.partial().strict().optional();
const maxBytes = z.number().int().positive().optional();
const surfaceClass = z.enum(['fracture', 'outer-cortical', 'medullary', 'articular']);

function failureToProblem(err: unknown, file: string): Problem {
  if (err instanceof ScanFileFailure) return { file: err.problem.file, line: err.problem.line, message: err.problem.message };
  return { file, message: err instanceof Error ? err.message : String(err) };
}

function hashFile(path: string): Promise<string> {
  return new Promise((ok, fail) => {
    const h = createHash('sha256');
    createReadStream(path).on('data', (d) => h.update(d)).on('end', () => ok(h.digest('hex'))).on('error', fail);
  });
}

/** What a catalogue keeps about a scan: the summary plus how it was made. */
function storedStats(r: ScanFileResult): Record<string, unknown> {
  return {
    ...r.summary,
    format: r.format,
    bytes: r.bytes,
    method: SCAN_ANALYSIS_VERSION,
    settings: r.settings,
    analysedAt: new Date().toISOString(),
  };
}

/** Path as stored: relative to the catalogue's folder when the file is inside it. */
function storedPath(catalogue: string, file: string): string {
  const rel = relative(dirname(resolve(catalogue)), resolve(file));
  return rel.startsWith('..') || isAbsolute(rel) ? resolve(file) : rel.split('\\').join('/');
}

/** Requests of the scans area: read and segment meshes, import a folder, correct regions. */
export const scanRequests = {
  'scans.inspect': defineRequest({
    summary: 'Read one mesh file and report its figures and its fracture and original surface faces',
    input: z
      .object({
        path: z.string().trim().min(1, 'give the path of a mesh file'),
        labels: z.string().trim().min(1).optional(),
        units,
        maxBytes,
        settings,
      })
      .strict(),
    run: (input) => {
      if (!existsSync(input.path)) throw new KnitboneError('not-found', [{ file: input.path, message: 'no such file' }]);
      let result: ScanFileResult;
      try {
        result = analyseScanFile({ path: input.path, units: input.units, maxBytes: input.maxBytes, settings: input.settings, withLabels: !!input.labels });
      } catch (err) {
        throw new KnitboneError('bad-input', [failureToProblem(err, input.path)]);
      }
      if (input.labels && result.labels) {
        try {
          writeFileSync(input.labels, result.labels);
        } catch (err) {
          throw new KnitboneError('bad-input', [{ file: input.labels, message: `cannot write the labels: ${(err as Error).message}` }]);
        }
      }
      const { labels: _labels, ...rest } = result;
      void _labels;
      return { ...rest.summary, format: rest.format, contentHash: rest.contentHash, units: rest.units };
    },
  }),

  'scans.import': defineRequest({
    summary: 'Read every mesh file in a folder, link each to the specimen named by its file name, measure and segment it',
    input: z
      .object({
        catalogue: z.string().trim().min(1, 'give the path of a catalogue file'),
        folder: z.string().trim().min(1, 'give the folder that holds the scans'),
        units,
        skipBad: z.boolean().default(false),
        workers: z.number().int().min(1).max(64).optional(),
        maxBytes,
        settings,
        who: z.string().trim().min(1).optional(),
      })
      .strict(),
    run: async (input, ctx) => {
      if (!existsSync(input.folder) || !statSync(input.folder).isDirectory()) {
        throw new KnitboneError('not-found', [{ file: input.folder, message: 'no such folder' }]);
      }
      const files = readdirSync(input.folder)
        .filter((f) => (MESH_EXTENSIONS as readonly string[]).includes(extname(f).toLowerCase()))
        .sort();
      return withCatalogue(input.catalogue, async (cat) => {
        const unmatched: string[] = [];
        const already: Array<{ file: string; catalogueNo: string; scanId: number }> = [];
        const todo: Array<{ file: string; specimenId: number; catalogueNo: string; hash: string }> = [];
        const seenStem = new Map<string, string>();
        let hashed = 0;
        for (const f of files) {
          ctx.onProgress({ stage: 'checking files', done: hashed++, total: files.length, detail: f });
          const stem = basename(f, extname(f));
          const specimen = cat.specimens.getByCatalogueNo(stem);
          if (!specimen) { unmatched.push(f); continue; }
          if (seenStem.has(stem)) {
            throw new KnitboneError('bad-input', [{ file: f, message: `${seenStem.get(stem)} is also named ${stem}: keep one scan file per specimen in the folder` }]);
          }
          seenStem.set(stem, f);
          const hash = await hashFile(join(input.folder, f));
          const existing = cat.scans.findByHash(specimen.id, hash);
          if (existing) already.push({ file: f, catalogueNo: stem, scanId: existing.id });
          else todo.push({ file: f, specimenId: specimen.id, catalogueNo: stem, hash });
        }
        const results = new Map<number, ScanFileResult>();
        const bad: Problem[] = [];
        let done = 0;
        ctx.onProgress({ stage: 'reading scans', done: 0, total: todo.length });
        const outcome = await runInWorkerPool<ScanFileJob, ScanFileResult>({
          moduleUrl: new URL('../../jobs/scan-worker.ts', import.meta.url),
          tasks: todo.map((t) => ({ path: join(input.folder, t.file), units: input.units, maxBytes: input.maxBytes, settings: input.settings, matchCacheDir: cacheDirFor(cat.path) })),
          workers: input.workers,
          signal: ctx.signal,
          onResult: (i, r) => {
            results.set(i, r);
            ctx.onProgress({ stage: 'reading scans', done: ++done, total: todo.length, detail: todo[i].file });
          },
          onError: (i, e) => {
            const detail = e.detail as ScanFileProblem | undefined;
            bad.push(detail ? { file: detail.file, line: detail.line, message: detail.message } : { file: i >= 0 ? todo[i].file : input.folder, message: e.message });
            ctx.onProgress({ stage: 'reading scans', done: ++done, total: todo.length, detail: i >= 0 ? todo[i].file : undefined });
            return input.skipBad ? undefined : 'stop';
          },
        });
        if (bad.length && !input.skipBad) {
          throw new KnitboneError('bad-input', [
            ...bad,
            { message: 'nothing was imported; fix or remove the file, or run again with --skip-bad to import the rest' },
          ]);
        }
        // Store every finished scan in one transaction: all of them or none.
        const imported = cat.transaction(() =>
          [...results.entries()].sort((a, b) => a[0] - b[0]).map(([i, r]) => {
            const t = todo[i];
            const scan = cat.scans.insert(
              { specimenId: t.specimenId, path: storedPath(input.catalogue, r.path), contentHash: t.hash, units: r.units, stats: storedStats(r) },
              input.who,
            );
            return {
              file: t.file,
              catalogueNo: t.catalogueNo,
              scanId: scan.id,
              triangles: r.summary.triangles,
              fractureFaces: r.summary.faces.filter((f) => f.kind === 'fracture').length,
              closed: r.summary.closed,
              warnings: r.summary.warnings,
            };
          }),
        );
        const remaining = todo.filter((_, i) => !results.has(i)).map((t) => t.file).filter((f) => !bad.some((b) => b.file === f));
        // what the next proposal run would describe first, described now (describe-faces.ts)
        const describedForMatching = outcome.cancelled || imported.length === 0 ? 0 : await describeForMatching(cat, { workers: input.workers, signal: ctx.signal, onProgress: ctx.onProgress });
        return {
          imported,
          describedForMatching,
          alreadyImported: already,
          unmatched,
          bad,
          cancelled: outcome.cancelled,
          remaining,
        };
      }, { who: input.who });
    },
  }),

  'scans.get': defineRequest({
    summary: 'One stored scan with its measured figures, regions and the analyst corrections in force',
    input: z.object({ catalogue: z.string().trim().min(1), scanId: z.number().int().positive() }).strict(),
    run: (input) =>
      withCatalogue(input.catalogue, (cat) => {
        const scan = cat.scans.require(input.scanId);
        return { ...scan, corrections: cat.regionClasses.list(scan.id) };
      }),
  }),

  'scans.correctRegion': defineRequest({
    summary: "Correct the class of one surface region of a scan (null withdraws the correction); the scan's faces are recomputed",
    input: z
      .object({
        catalogue: z.string().trim().min(1),
        scanId: z.number().int().positive(),
        regionId: z.number().int().min(0),
        surfaceClass: surfaceClass.nullable(),
        who: z.string().trim().min(1).optional(),
      })
      .strict(),
    run: (input) =>
      withCatalogue(input.catalogue, (cat) => {
        const scan = cat.scans.require(input.scanId);
        const regions = (scan.stats.regions ?? []) as Array<{ id: number }>;
        if (!regions.some((r) => r.id === input.regionId)) {
          throw new KnitboneError('bad-input', [{ field: 'regionId', message: `scan ${scan.id} has no region ${input.regionId} (regions 0 to ${regions.length - 1})` }]);
        }
        const filePath = isAbsolute(scan.path) ? scan.path : join(dirname(resolve(input.catalogue)), scan.path);
        const corrections = new Map(cat.regionClasses.inForce(scan.id));
        if (input.surfaceClass) corrections.set(input.regionId, input.surfaceClass);
        else corrections.delete(input.regionId);
        // Recompute the faces with the correction before anything is written.
        let stats: Record<string, unknown> | undefined;
        if (existsSync(filePath)) {
          const r = analyseScanFile({
            path: filePath,
            units: scan.units,
            settings: scan.stats.settings as ScanFileJob['settings'],
            corrections: [...corrections.entries()],
          });
          stats = storedStats(r);
        }
        const classOf = (st: Record<string, unknown> | undefined): string | undefined =>
          ((st?.regions ?? []) as Array<{ id: number; surfaceClass?: string }>).find((r) => r.id === input.regionId)?.surfaceClass;
        return cat.transaction(() => {
          const correction = cat.regionClasses.correct(scan.id, input.regionId, input.surfaceClass, input.who, {
            before: classOf(scan.stats),
            after: input.surfaceClass ?? classOf(stats),
          });
          const updated = stats ? cat.scans.updateStats(scan.id, stats, input.who) : scan;
          return { correction, scan: updated, recomputed: stats !== undefined };
        });
      }, { who: input.who }),
  }),
};
