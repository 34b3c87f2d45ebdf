/**
 * Keeps the end of a job's output for its failure record: the full log goes to log.txt,
 * the last lines go into result.json so a failure explains itself without opening files.
 */
const KEEP_CHARS = 16_384;

export class LogTail {
  private text = '';

  /** Appends raw output (any chunking). */
  append(chunk: string): void {
    this.text = (this.text + chunk).slice(-KEEP_CHARS);
  }

  /** True when the kept output matches `pattern`. */
  matches(pattern: RegExp): boolean {
    return pattern.test(this.text);
  }

  /** The last `lines` complete lines (and a trailing partial line), trimmed. */
  lastLines(lines = 30): string {
    return this.text.trimEnd().split('\n').slice(-lines).join('\n');
  }
}
