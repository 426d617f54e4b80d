import { MeshFileError } from './mesh-file-error';

/**
 * The PLY header, read and checked before three.js decodes the body: three's PLYLoader
 * trusts the header, so a short file or a count that lies would give a silently wrong mesh
 * or a RangeError. PLY format: Turk 1994, "The PLY polygon file format".
 */
export type PlyFormat = 'ascii' | 'binary_little_endian' | 'binary_big_endian';

export interface PlyProperty {
  name: string;
  /** Scalar type, or for a list the type of its items. */
  type: string;
  /** Set for list properties: the type of the count that precedes the items. */
  countType?: string;
}

export interface PlyElement {
  name: string;
  count: number;
  properties: PlyProperty[];
}

export interface PlyHeader {
  format: PlyFormat;
  elements: PlyElement[];
  /** Byte offset where the body starts. */
  bodyOffset: number;
  /** Number of text lines in the header (for line numbers of ASCII bodies). */
  headerLines: number;
}

const TYPE_SIZES: Record<string, number> = {
  char: 1, uchar: 1, int8: 1, uint8: 1,
  short: 2, ushort: 2, int16: 2, uint16: 2,
  int: 4, uint: 4, int32: 4, uint32: 4, float: 4, float32: 4,
  double: 8, float64: 8,
};

export function plyTypeSize(type: string): number | undefined {
  return TYPE_SIZES[type];
}

const MAX_HEADER_BYTES = 64 * 1024;

export function readPlyHeader(bytes: Uint8Array): PlyHeader {
  const magic = String.fromCharCode(...bytes.subarray(0, 3));
  if (magic !== 'ply') throw new MeshFileError('not a PLY file: it does not start with "ply"', 1);
  // Find "end_header" followed by a line end.
  const limit = Math.min(bytes.length, MAX_HEADER_BYTES);
  let text = '';
  for (let i = 0; i < limit; i++) text += String.fromCharCode(bytes[i]);
  const m = /end_header[ \t]*(\r\n|\n|\r)/.exec(text);
  if (!m) {
    throw new MeshFileError(
      bytes.length <= MAX_HEADER_BYTES
        ? 'PLY header has no "end_header" line: the file is truncated or not PLY'
        : `PLY header is longer than ${MAX_HEADER_BYTES} bytes or has no "end_header" line`,
    );
  }
  const bodyOffset = m.index + m[0].length;
  const lines = text.slice(0, m.index).split(/\r\n|\n|\r/);
  let format: PlyFormat | undefined;
  const elements: PlyElement[] = [];
  for (let i = 0; i < lines.length; i++) {
    const lineNo = i + 1;
    const words = lines[i].trim().split(/\s+/).filter(Boolean);
    if (words.length === 0) continue;
    const [kind] = words;
    if (kind === 'ply' || kind === 'comment' || kind === 'obj_info') continue;
    if (kind === 'format') {
      const f = words[1];
      if (f !== 'ascii' && f !== 'binary_little_endian' && f !== 'binary_big_endian') {
        throw new MeshFileError(`unknown PLY format "${f ?? ''}" (expected ascii, binary_little_endian or binary_big_endian)`, lineNo);
      }
      format = f;
    } else if (kind === 'element') {
      const count = Number(words[2]);
      if (!words[1] || !Number.isInteger(count) || count < 0) {
        throw new MeshFileError(`PLY element line needs a name and a whole count, got "${lines[i].trim()}"`, lineNo);
      }
      elements.push({ name: words[1], count, properties: [] });
    } else if (kind === 'property') {
      const el = elements[elements.length - 1];
      if (!el) throw new MeshFileError('PLY property before any element line', lineNo);
      if (words[1] === 'list') {
        if (!plyTypeSize(words[2] ?? '') || !plyTypeSize(words[3] ?? '') || !words[4]) {
          throw new MeshFileError(`PLY list property needs count type, item type and name, got "${lines[i].trim()}"`, lineNo);
        }
        el.properties.push({ name: words[4], type: words[3], countType: words[2] });
      } else {
        if (!plyTypeSize(words[1] ?? '') || !words[2]) {
          throw new MeshFileError(`PLY property has an unknown type or no name: "${lines[i].trim()}"`, lineNo);
        }
        el.properties.push({ name: words[2], type: words[1] });
      }
    } else {
      throw new MeshFileError(`unexpected PLY header line "${lines[i].trim().slice(0, 60)}"`, lineNo);
    }
  }
  if (!format) throw new MeshFileError('PLY header has no format line');
  const vertex = elements.find((e) => e.name === 'vertex');
  if (!vertex) throw new MeshFileError('PLY header declares no vertex element');
  for (const axis of ['x', 'y', 'z']) {
    const p = vertex.properties.find((q) => q.name === axis);
    if (!p || p.countType) throw new MeshFileError(`PLY vertex element has no scalar "${axis}" property`);
  }
  const face = elements.find((e) => e.name === 'face');
  if (!face) throw new MeshFileError('PLY header declares no face element: a point cloud is not a surface scan');
  const list = face.properties.find((p) => p.countType && (p.name === 'vertex_indices' || p.name === 'vertex_index'));
  if (!list) throw new MeshFileError('PLY face element has no "vertex_indices" list property');
  if (/float|double/.test(list.type)) throw new MeshFileError('PLY face vertex indices must be integers, not floating point');
  return { format, elements, bodyOffset, headerLines: lines.length + 1 };
}

/**
 * Walk a binary body without decoding it: check that every element the header declares is
 * there, that list counts are sane, and that nothing follows the last element.
 */
export function checkPlyBinaryBody(bytes: Uint8Array, header: PlyHeader): void {
  const little = header.format === 'binary_little_endian';
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  let at = header.bodyOffset;
  const end = bytes.length;
  for (const el of header.elements) {
    const fixed = el.properties.every((p) => !p.countType);
    if (fixed) {
      const size = el.properties.reduce((s, p) => s + plyTypeSize(p.type)!, 0);
      const need = size * el.count;
      if (at + need > end) {
        throw new MeshFileError(
          `PLY file is truncated: the header declares ${el.count} ${el.name} elements (${need} bytes) but only ${Math.max(0, end - at)} bytes remain`,
        );
      }
      at += need;
      continue;
    }
    for (let r = 0; r < el.count; r++) {
      for (const p of el.properties) {
        if (!p.countType) {
          at += plyTypeSize(p.type)!;
          continue;
        }
        const cs = plyTypeSize(p.countType)!;
        if (at + cs > end) throw truncated(el, r);
        const n = readCount(view, at, p.countType, little);
        at += cs;
        if (!Number.isInteger(n) || n < 0 || n > 1000) {
          throw new MeshFileError(`PLY ${el.name} ${r} has an impossible list length ${n}: the header or the body is corrupt`);
        }
        if (el.name === 'face' && (p.name === 'vertex_indices' || p.name === 'vertex_index') && n < 3) {
          throw new MeshFileError(`PLY face ${r} has ${n} vertices; a face needs at least 3`);
        }
        at += n * plyTypeSize(p.type)!;
      }
      if (at > end) throw truncated(el, r);
    }
  }
  if (at > end) throw new MeshFileError('PLY file is truncated: the body is shorter than the header declares');
  const trailing = end - at;
  if (trailing > 0) {
    let blank = true;
    for (let i = at; i < end; i++) if (bytes[i] !== 0x0a && bytes[i] !== 0x0d && bytes[i] !== 0x20 && bytes[i] !== 0) blank = false;
    if (!blank || trailing > 4) {
      throw new MeshFileError(
        `PLY file has ${trailing} bytes after the last element the header declares: the header's counts are wrong or the file is corrupt`,
      );
    }
  }
}

function truncated(el: PlyElement, r: number): MeshFileError {
  return new MeshFileError(`PLY file is truncated: it ends inside ${el.name} ${r} of the ${el.count} the header declares`);
}

function readCount(view: DataView, at: number, type: string, little: boolean): number {
  switch (type) {
    case 'char': case 'int8': return view.getInt8(at);
    case 'uchar': case 'uint8': return view.getUint8(at);
    case 'short': case 'int16': return view.getInt16(at, little);
    case 'ushort': case 'uint16': return view.getUint16(at, little);
    case 'int': case 'int32': return view.getInt32(at, little);
    case 'uint': case 'uint32': return view.getUint32(at, little);
    case 'float': case 'float32': return view.getFloat32(at, little);
    default: return view.getFloat64(at, little);
  }
}

/**
 * Check an ASCII body line by line: the number of lines the header declares, the number of
 * values on each line, and that every value is a number.
 */
export function checkPlyAsciiBody(text: string, header: PlyHeader): void {
  const lines = text.split(/\r\n|\n|\r/);
  let li = 0;
  const nextLine = (): { words: string[]; lineNo: number } | undefined => {
    while (li < lines.length) {
      const raw = lines[li++].trim();
      if (raw !== '') return { words: raw.split(/\s+/), lineNo: header.headerLines + li };
    }
    return undefined;
  };
  for (const el of header.elements) {
    for (let r = 0; r < el.count; r++) {
      const line = nextLine();
      if (!line) {
        throw new MeshFileError(`PLY file is truncated: the header declares ${el.count} ${el.name} lines but the file ends after ${r}`);
      }
      let k = 0;
      for (const p of el.properties) {
        if (p.countType) {
          const n = Number(line.words[k++]);
          if (!Number.isInteger(n) || n < 0 || n > 1000) {
            throw new MeshFileError(`PLY ${el.name} ${r} has an impossible list length "${line.words[k - 1] ?? ''}"`, line.lineNo);
          }
          if (el.name === 'face' && n < 3) throw new MeshFileError(`PLY face ${r} has ${n} vertices; a face needs at least 3`, line.lineNo);
          for (let j = 0; j < n; j++) {
            const w = line.words[k++];
            if (w === undefined) throw new MeshFileError(`PLY ${el.name} ${r} has fewer values than its list length says`, line.lineNo);
            if (!/^[+-]?\d+$/.test(w) && el.name === 'face') throw new MeshFileError(`PLY face ${r} has a vertex index that is not a whole number: "${w}"`, line.lineNo);
          }
        } else {
          const w = line.words[k++];
          if (w === undefined) throw new MeshFileError(`PLY ${el.name} ${r} has fewer values than the header's ${el.properties.length} properties`, line.lineNo);
          if (!isNumberWord(w)) throw new MeshFileError(`PLY ${el.name} ${r}, property ${p.name}: "${w.slice(0, 30)}" is not a number`, line.lineNo);
        }
      }
      if (k !== line.words.length) {
        throw new MeshFileError(`PLY ${el.name} ${r} has ${line.words.length} values where the header implies ${k}`, line.lineNo);
      }
    }
  }
  const extra = nextLine();
  if (extra) {
    throw new MeshFileError('PLY file has more lines than the header declares: its element counts are wrong', extra.lineNo);
  }
}

function isNumberWord(w: string): boolean {
  // nan and inf are numbers here; they are reported later as bad coordinates.
  return /^[+-]?(\d+\.?\d*([eE][+-]?\d+)?|\.\d+([eE][+-]?\d+)?|nan|inf|infinity)$/i.test(w);
}
