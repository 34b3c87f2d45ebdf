/**
 * Finds a worker's end-of-job marker in its stdout or stderr stream. A reused worker prints
 * the marker on both streams after each job, so everything before it belongs to that job's
 * log and everything after it to whatever the worker does next, whichever way the pipe
 * happened to cut the bytes into chunks.
 */
export class EndMarkerScanner {
  private held = '';

  constructor(private readonly marker: string) {}

  /**
   * Feeds a chunk. Returns the text that is certainly not part of the marker (`before`),
   * whether the marker ended in this chunk, and the text after it (`after`, only when found).
   * A suffix that could be the start of the marker is held back until the next chunk.
   */
  feed(chunk: string): { before: string; found: boolean; after: string } {
    const text = this.held + chunk;
    const at = text.indexOf(this.marker);
    if (at >= 0) {
      this.held = '';
      return { before: text.slice(0, at), found: true, after: text.slice(at + this.marker.length) };
    }
    const keep = this.partialSuffix(text);
    this.held = text.slice(text.length - keep);
    return { before: text.slice(0, text.length - keep), found: false, after: '' };
  }

  /** Text held back as a possible marker start (the stream ended, so it was not one). */
  flush(): string {
    const text = this.held;
    this.held = '';
    return text;
  }

  /** Length of the longest suffix of `text` that is a proper prefix of the marker. */
  private partialSuffix(text: string): number {
    const longest = Math.min(text.length, this.marker.length - 1);
    for (let n = longest; n > 0; n -= 1) {
      if (this.marker.startsWith(text.slice(text.length - n))) return n;
    }
    return 0;
  }
}
