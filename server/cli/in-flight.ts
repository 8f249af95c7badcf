/**
 * Tasks started one after another with at most `limit` pending at once: the command's batches in the
 * worker pool, the sheets being written. The first failure is kept until someone waits (`add` or
 * `done`), even when the task ended long before: it is never lost and never an unhandled rejection.
 */
export class InFlight {
  private readonly pending = new Set<Promise<void>>();
  private failure: { error: unknown } | undefined;

  constructor(private readonly limit: number) {}

  /** Waits for room, then starts `task`; throws the first failure so far. */
  async add(task: () => Promise<void>): Promise<void> {
    this.throwIfFailed();
    while (this.pending.size >= this.limit) {
      await Promise.race(this.pending);
      this.throwIfFailed();
    }
    const tracked = task()
      .catch((error: unknown) => {
        this.failure ??= { error };
      })
      .finally(() => this.pending.delete(tracked));
    this.pending.add(tracked);
  }

  /** Every pending task finished; throws the first failure of any task. */
  async done(): Promise<void> {
    await this.settled();
    this.throwIfFailed();
  }

  /** Every pending task ended, failed or not: for cleaning up after an error. */
  async settled(): Promise<void> {
    await Promise.all(this.pending);
  }

  private throwIfFailed(): void {
    if (this.failure) throw this.failure.error;
  }
}
