/**
 * One line on standard error that rewrites itself while a long check runs: submissions done of the
 * file's estimated total, the rate, and the time left. The total is estimated from the bytes read so
 * far, as a streamed file is checked before it is counted.
 */
const EVERY_MS = 250;

export class ProgressLine {
  private readonly start: number;
  private last = -Infinity;
  private shown = false;

  constructor(
    private readonly write: (text: string) => void,
    private readonly fileBytes: number,
    private readonly now: () => number = () => performance.now(),
  ) {
    this.start = now();
  }

  /** `done` submissions finished, from the first `bytes` of the file. */
  update(done: number, bytes: number): void {
    const t = this.now();
    if (t - this.last < EVERY_MS || done === 0 || bytes === 0) return;
    this.last = t;
    const seconds = (t - this.start) / 1000;
    const total = Math.max(done, Math.round((done * this.fileBytes) / bytes));
    const rate = seconds > 0 ? done / seconds : 0;
    const left = rate > 0 ? (total - done) / rate : undefined;
    const count = (n: number) => n.toLocaleString('en-US');
    const parts = [`${count(done)} of about ${count(total)} submissions`, `${count(Math.round(rate))}/s`, ...(left === undefined ? [] : [`${duration(left)} left`])];
    this.write(`\r${parts.join(' · ')}\x1b[K`);
    this.shown = true;
  }

  /** Clears the line, so that what follows starts on a clean one. */
  end(): void {
    if (this.shown) this.write('\r\x1b[K');
    this.shown = false;
  }
}

function duration(seconds: number): string {
  const s = Math.round(seconds);
  return s < 60 ? `${s} s` : `${Math.floor(s / 60)} min ${String(s % 60).padStart(2, '0')} s`;
}
