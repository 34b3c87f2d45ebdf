/**
 * Stopping a sweep from outside: `drain()` (first Ctrl-C) starts no new job and lets running
 * ones finish; `kill()` (second Ctrl-C) kills running workers at once. Results already
 * written are kept either way.
 */
export class SweepControl {
  private drainingFlag = false;
  private killedFlag = false;
  private readonly cancels = new Set<() => void>();
  private readonly listeners = new Set<() => void>();

  get draining(): boolean {
    return this.drainingFlag;
  }

  get killed(): boolean {
    return this.killedFlag;
  }

  /** Stop starting jobs. */
  drain(): void {
    this.drainingFlag = true;
    for (const listener of this.listeners) listener();
  }

  /** Stop starting jobs and kill the running workers. */
  kill(): void {
    this.drain();
    this.killedFlag = true;
    for (const cancel of this.cancels) cancel();
  }

  /** Calls `listener` once on drain (used to wake waiting loops). */
  onDrain(listener: () => void): () => void {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  }

  /** Registers a running worker's cancel; returns the unregister function. */
  track(cancel: () => void): () => void {
    if (this.killedFlag) cancel();
    this.cancels.add(cancel);
    return () => this.cancels.delete(cancel);
  }

  /** Number of workers running now. */
  get running(): number {
    return this.cancels.size;
  }
}
