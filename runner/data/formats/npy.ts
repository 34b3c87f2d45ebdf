/**
 * A reader for NumPy `.npy` files, versions 1.0, 2.0 and 3.0, as specified in the NumPy
 * Enhancement Proposal NEP 1 ("A simple file format for NumPy arrays", Kern, 2007): the magic
 * string \x93NUMPY, a version, a little-endian header length (2 bytes in v1, 4 in v2/v3), and
 * an ASCII Python-dict header with 'descr', 'fortran_order' and 'shape'. Only little-endian
 * float32 / float64 in C order is accepted; anything else is rejected with a fix.
 * Pure: takes bytes, returns an array; the caller reads the file.
 */
import { DataError } from '../data-error.ts';

/** A parsed array: shape and the values in C (row-major) order. */
export interface NpyArray {
  shape: number[];
  data: Float32Array | Float64Array;
}

const MAGIC = [0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59]; // \x93 N U M P Y

/** Parses `.npy` bytes; `fileName` only labels errors. Throws DataError on bad input. */
export function parseNpy(bytes: Uint8Array, fileName = '<npy>'): NpyArray {
  const fail = (message: string, hint: string, code: 'bad-npy' = 'bad-npy'): never => {
    throw new DataError({ code, file: fileName, index: 'header', message, hint });
  };
  const resave = 'save it again with numpy.save(path, array.astype("float32"))';
  if (bytes.length < 10 || MAGIC.some((b, i) => bytes[i] !== b)) {
    fail(
      'expected the NumPy magic string \\x93NUMPY, got other bytes',
      `is this a .npy file? ${resave}`,
    );
  }
  const major = bytes[6]!;
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  let headerLen: number;
  let headerStart: number;
  if (major === 1) {
    headerLen = view.getUint16(8, true);
    headerStart = 10;
  } else if (major === 2 || major === 3) {
    if (bytes.length < 12) fail('expected a 4-byte header length, got a truncated file', resave);
    headerLen = view.getUint32(8, true);
    headerStart = 12;
  } else {
    return fail(`expected format version 1, 2 or 3, got ${major}`, resave);
  }
  const dataStart = headerStart + headerLen;
  if (dataStart > bytes.length) fail('expected a complete header, got a truncated file', resave);
  const header = new TextDecoder('latin1').decode(bytes.subarray(headerStart, dataStart));
  const { descr, fortran, shape } = parseHeader(header, fileName);
  if (fortran) {
    fail(
      'expected fortran_order False (C order), got True',
      'save numpy.ascontiguousarray(array) instead of a Fortran-ordered array',
    );
  }
  const width = dtypeWidth(descr, fileName);
  const count = shape.reduce((a, b) => a * b, 1);
  const available = bytes.length - dataStart;
  if (available < count * width) {
    fail(
      `expected ${count * width} bytes of data for shape (${shape.join(', ')}), got ${available}`,
      `the file is truncated; ${resave}`,
    );
  }
  const data = width === 4 ? new Float32Array(count) : new Float64Array(count);
  // DataView reads little-endian explicitly, so the result is the same on any host.
  for (let i = 0; i < count; i++) {
    data[i] =
      width === 4
        ? view.getFloat32(dataStart + 4 * i, true)
        : view.getFloat64(dataStart + 8 * i, true);
  }
  return { shape, data };
}

interface NpyHeader {
  descr: string;
  fortran: boolean;
  shape: number[];
}

function parseHeader(header: string, fileName: string): NpyHeader {
  const descr = /['"]descr['"]\s*:\s*['"]([^'"]+)['"]/.exec(header)?.[1];
  const fortran = /['"]fortran_order['"]\s*:\s*(True|False)/.exec(header)?.[1];
  const shapeText = /['"]shape['"]\s*:\s*\(([^)]*)\)/.exec(header)?.[1];
  if (descr === undefined || fortran === undefined || shapeText === undefined) {
    throw new DataError({
      code: 'bad-npy',
      file: fileName,
      index: 'header',
      message: `expected a header with 'descr', 'fortran_order' and 'shape', got ${JSON.stringify(header.trim().slice(0, 120))}`,
      hint: 'write the file with numpy.save',
    });
  }
  const parts = shapeText
    .split(',')
    .map((s) => s.trim())
    .filter((s) => s.length > 0);
  const shape = parts.map((p) => {
    const n = Number(p.replace(/L$/, ''));
    if (!Number.isInteger(n) || n < 0) {
      throw new DataError({
        code: 'bad-npy',
        file: fileName,
        index: 'header',
        message: `expected non-negative integer dimensions in shape, got (${shapeText})`,
        hint: 'write the file with numpy.save',
      });
    }
    return n;
  });
  return { descr, fortran: fortran === 'True', shape };
}

function dtypeWidth(descr: string, fileName: string): 4 | 8 {
  if (descr === '<f4') return 4;
  if (descr === '<f8') return 8;
  throw new DataError({
    code: 'unsupported-dtype',
    file: fileName,
    index: 'header',
    message: `expected dtype '<f4' or '<f8' (little-endian float32/float64), got '${descr}'`,
    hint: "convert with array.astype('<f4') before numpy.save",
  });
}
