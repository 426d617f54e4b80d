import { readFileSync } from 'node:fs';
import { BufferGeometry } from 'three';
import { PLYLoader } from 'three/examples/jsm/loaders/PLYLoader.js';

/** Read a scan with three.js's PLY loader (a reference reader we did not write). */
export function readScanPly(path: string): { positions: Float32Array; triangles: Uint32Array } {
  const bytes = readFileSync(path);
  const geometry: BufferGeometry = new PLYLoader().parse(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength));
  const index = geometry.getIndex();
  if (!index) throw new Error(`${path}: no faces`);
  return { positions: new Float32Array(geometry.getAttribute('position').array), triangles: new Uint32Array(index.array) };
}

export function loadTruth(dir: string): Truth {
  return JSON.parse(readFileSync(`${dir}/truth.json`, 'utf8')) as Truth;
}

export interface Truth {
  pointSpacingMm: number;
  fragments: Array<{
    catalogueNo: string;
    scanFile: string;
    boneId: string;
    poseBoneToScan: number[];
    volumeMm3: number;
    triangleCount: number;
    vertexCount: number;
    triangleLabels: string;
    breaks: number[];
  }>;
  bones: Array<{ boneId: string; breaks: Array<{ id: number; age: string; pattern: string }>; fragments: string[] }>;
  joins: Array<{ a: string; b: string; breakId: number; breakAge: string; pattern: string; transformBToA: number[]; contactAreaMm2: number; survivingFraction: number }>;
}
