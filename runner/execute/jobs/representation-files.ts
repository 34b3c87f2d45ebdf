/**
 * A fitted representation on disk: `representation.json` (everything but the numbers) and one
 * little-endian float32 file per array, `representation.<name>.f32`, row-major with the shape
 * recorded in the JSON. Reloading runs the same restore code as the fit, so the reloaded
 * representation encodes identically.
 */
import { readFile, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import type { Representation } from '../../training/representation.ts';
import { restoreRepresentation, type SerialisedRepresentation } from '../../training/serialised.ts';
import { TrainingError } from '../../training/training-error.ts';

const HEADER = 'representation.json';
const FORMAT = 'midpath-representation/1';

interface ArrayEntry {
  shape: number[];
  file: string;
  length: number;
}

type Header = Omit<SerialisedRepresentation, 'arrays'> & {
  format: string;
  arrays: Record<string, ArrayEntry>;
};

function arrayFile(name: string): string {
  return `representation.${name}.f32`;
}

/** Writes the representation into `dir`; returns the file names written (relative to dir). */
export async function saveRepresentation(
  dir: string,
  serialised: SerialisedRepresentation,
): Promise<string[]> {
  const arrays: Record<string, ArrayEntry> = {};
  const files: string[] = [];
  for (const [name, a] of Object.entries(serialised.arrays)) {
    const file = arrayFile(name);
    const copy = Float32Array.from(a.data); // own buffer: subarrays would write their parent
    await writeFile(join(dir, file), new Uint8Array(copy.buffer));
    arrays[name] = { shape: a.shape, file, length: a.data.length };
    files.push(file);
  }
  const header: Header = { ...serialised, format: FORMAT, arrays };
  await writeFile(join(dir, HEADER), `${JSON.stringify(header, null, 2)}\n`);
  return [HEADER, ...files];
}

async function readHeader(dir: string): Promise<Header> {
  const file = join(dir, HEADER);
  let text: string;
  try {
    text = await readFile(file, 'utf8');
  } catch {
    throw new TrainingError(
      'representation-file',
      'expected a saved representation, got no such file; rerun the train job',
      file,
    );
  }
  let header: Header;
  try {
    header = JSON.parse(text) as Header;
  } catch (error) {
    throw new TrainingError(
      'representation-file',
      `expected JSON, got: ${(error as Error).message}`,
      file,
    );
  }
  if (header.format !== FORMAT) {
    throw new TrainingError(
      'representation-file',
      `expected format '${FORMAT}', got '${String(header.format)}'; rerun the train job`,
      file,
    );
  }
  return header;
}

/** Reads the arrays of a saved representation, checking each file's length. */
export async function readSerialised(dir: string): Promise<SerialisedRepresentation> {
  const header = await readHeader(dir);
  const arrays: SerialisedRepresentation['arrays'] = {};
  for (const [name, entry] of Object.entries(header.arrays)) {
    const file = join(dir, entry.file);
    const bytes = await readFile(file).catch(() => {
      throw new TrainingError(
        'representation-file',
        `expected the array file of '${name}', got no such file`,
        file,
      );
    });
    if (bytes.length !== entry.length * 4) {
      throw new TrainingError(
        'representation-file',
        `expected ${entry.length} float32 values (${entry.length * 4} bytes), got ${bytes.length} bytes`,
        file,
      );
    }
    const data = new Float32Array(entry.length);
    new Uint8Array(data.buffer).set(bytes);
    arrays[name] = { shape: entry.shape, data };
  }
  const { method, label, dim, obsDim, model, meta, critic } = header;
  return {
    method,
    label,
    dim,
    obsDim,
    model,
    meta,
    arrays,
    ...(critic === undefined ? {} : { critic }),
  };
}

/** Loads a representation saved by saveRepresentation. */
export async function loadRepresentation(dir: string): Promise<Representation> {
  return restoreRepresentation(await readSerialised(dir));
}
