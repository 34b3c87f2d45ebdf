import { isMap, isPair, isScalar, isSeq, type LineCounter, type Node } from 'yaml';

/** A 1-based position in one file. */
export interface SourcePos {
  file: string;
  line: number;
  col: number;
}

/** Where one config value was written: its key (for mapping entries) and its value. */
export interface NodeLocation {
  key?: SourcePos;
  value: SourcePos;
}

/** A config path: mapping keys and list indices, outermost first. */
export type ConfigPath = readonly (string | number)[];

function keyOf(path: ConfigPath): string {
  return path.map(String).join('\u0000');
}

/**
 * Remembers where every value of a (possibly merged) config came from, so that errors found
 * on plain JS values can point back at file:line:col. Later `record` calls win, which is what
 * `extends` merging needs: the overriding file's positions replace the base file's.
 */
export class LocationMap {
  private readonly entries = new Map<string, NodeLocation>();

  constructor(private readonly fallback: SourcePos) {}

  /** Records the location of the value at `path`. */
  record(path: ConfigPath, location: NodeLocation): void {
    this.entries.set(keyOf(path), location);
  }

  /** Copies every entry of `other` into this map (entries of `other` win). */
  absorb(other: LocationMap): void {
    for (const [key, value] of other.entries) this.entries.set(key, value);
  }

  /** Location of `path`, or of its nearest recorded ancestor, or the file start. */
  locate(path: ConfigPath, prefer: 'key' | 'value' = 'value'): SourcePos {
    for (let n = path.length; n >= 0; n--) {
      const found = this.entries.get(keyOf(path.slice(0, n)));
      if (found)
        return (prefer === 'key' && n === path.length ? found.key : undefined) ?? found.value;
    }
    return this.fallback;
  }

  /** Forgets `path` and everything below it (its value was replaced from elsewhere). */
  forget(path: ConfigPath): void {
    const key = keyOf(path);
    for (const existing of [...this.entries.keys()]) {
      if (existing === key || existing.startsWith(`${key}\u0000`)) this.entries.delete(existing);
    }
  }
}

function positionAt(file: string, counter: LineCounter, offset: number): SourcePos {
  const { line, col } = counter.linePos(offset);
  return { file, line, col };
}

/** Walks a parsed YAML tree and records key and value positions under `prefix`. */
export function recordYamlLocations(
  node: Node | null | undefined,
  file: string,
  counter: LineCounter,
  map: LocationMap,
  prefix: ConfigPath = [],
): void {
  if (!node) return;
  if (isMap(node)) {
    for (const pair of node.items) {
      if (!isPair(pair) || !isScalar(pair.key)) continue;
      const key = String(pair.key.value);
      const keyPos = positionAt(file, counter, pair.key.range?.[0] ?? 0);
      const valueNode = pair.value as Node | null;
      const valuePos = valueNode?.range ? positionAt(file, counter, valueNode.range[0]) : keyPos;
      map.record([...prefix, key], { key: keyPos, value: valuePos });
      recordYamlLocations(valueNode, file, counter, map, [...prefix, key]);
    }
  } else if (isSeq(node)) {
    node.items.forEach((item, index) => {
      const itemNode = item as Node | null;
      if (!itemNode?.range) return;
      map.record([...prefix, index], { value: positionAt(file, counter, itemNode.range[0]) });
      recordYamlLocations(itemNode, file, counter, map, [...prefix, index]);
    });
  }
}
