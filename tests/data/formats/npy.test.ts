import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { DataError } from '../../../runner/data/data-error.ts';
import { parseNpy } from '../../../runner/data/formats/npy.ts';

// Fixtures are written by NumPy's own numpy.save / numpy.lib.format.write_array (the
// reference implementation of NEP 1), see tests/fixtures/data/npy/make-fixtures.py.
const dir = new URL('../../fixtures/data/npy/', import.meta.url);
const read = (name: string): Uint8Array => new Uint8Array(readFileSync(new URL(name, dir)));

function expectDataError(fn: () => unknown, code: string): DataError {
  try {
    fn();
  } catch (error) {
    expect(error).toBeInstanceOf(DataError);
    expect((error as DataError).code).toBe(code);
    return error as DataError;
  }
  throw new Error(`expected a DataError with code ${code}`);
}

describe('parseNpy against files written by NumPy (NEP 1)', () => {
  it('reads a float32 [2, 3, 4] array in C order', () => {
    const { shape, data } = parseNpy(read('episodes-f4.npy'));
    expect(shape).toEqual([2, 3, 4]);
    expect(data).toBeInstanceOf(Float32Array);
    // The fixture is arange(24)/8 - 1 in C order (make-fixtures.py).
    expect(Array.from(data)).toEqual(Array.from({ length: 24 }, (_, i) => i / 8 - 1));
  });

  it('reads float64 exactly, including extreme exponents', () => {
    const { shape, data } = parseNpy(read('matrix-f8.npy'));
    expect(shape).toEqual([3, 2]);
    expect(data).toBeInstanceOf(Float64Array);
    expect(Array.from(data)).toEqual([1.5, -2.25, 1e-300, 3e300, 0.1, 7.0]);
  });

  it('reads format version 2.0 (4-byte header length)', () => {
    const v2 = read('v2-f4.npy');
    expect(v2[6]).toBe(2);
    expect(parseNpy(v2).data).toEqual(parseNpy(read('episodes-f4.npy')).data);
  });

  it('reads a zero-length array', () => {
    const { shape, data } = parseNpy(read('empty.npy'));
    expect(shape).toEqual([0, 5, 3]);
    expect(data.length).toBe(0);
  });

  it.each([
    ['big-endian.npy', 'unsupported-dtype'],
    ['int32.npy', 'unsupported-dtype'],
    ['fortran.npy', 'bad-npy'],
    ['truncated.npy', 'bad-npy'],
  ])('rejects %s with code %s, naming the file', (name, code) => {
    const error = expectDataError(() => parseNpy(read(name), name), code);
    expect(error.file).toBe(name);
    expect(error.message).toContain(name);
    expect(error.hint.length).toBeGreaterThan(0);
  });

  it('rejects bytes that are not a .npy file', () => {
    const bytes = new TextEncoder().encode('episode,step,x\n0,0,1\n');
    expectDataError(() => parseNpy(bytes, 'x.npy'), 'bad-npy');
  });
});
