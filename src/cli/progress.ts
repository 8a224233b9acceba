/**
 * Progress on stderr: a redrawn bar on a terminal, occasional plain lines otherwise (logs),
 * so stdout stays clean for --json.
 */
export class ProgressBar {
  private lastShown = -10;
  private lastShownAt = 0;
  private readonly started = performance.now();
  constructor(private readonly label: string, private readonly stream: NodeJS.WriteStream = process.stderr) {}

  update(done: number, total: number, note = ''): void {
    const fraction = total > 0 ? Math.min(1, done / total) : 1;
    const percent = Math.floor(fraction * 100);
    const elapsed = (performance.now() - this.started) / 1000;
    const left = fraction > 0 ? (elapsed * (1 - fraction)) / fraction : NaN;
    const tail = `${percent}% ${done}/${total}${note ? ` ${note}` : ''}${Number.isFinite(left) && fraction < 1 ? `, ~${left.toFixed(0)} s left` : ''}`;
    if (this.stream.isTTY) {
      const width = 28;
      const filled = Math.round(fraction * width);
      this.stream.write(`\r${this.label} [${'#'.repeat(filled)}${'.'.repeat(width - filled)}] ${tail}\x1b[K`);
    } else if (percent >= this.lastShown + 10 || (fraction === 1 && this.lastShown < 100) || performance.now() - this.lastShownAt > 5000) {
      this.lastShown = percent - (percent % 10);
      this.lastShownAt = performance.now();
      this.stream.write(`${this.label}: ${tail}\n`);
    }
  }

  done(message = ''): void {
    if (this.stream.isTTY) this.stream.write('\r\x1b[K');
    if (message) this.stream.write(`${message}\n`);
  }
}
