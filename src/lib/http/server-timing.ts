/**
 * Phases of a request's server time, for the Server-Timing header (W3C Server Timing): each
 * `mark(name)` closes the phase that ran since the previous mark. Pure apart from the clock.
 */
export class Phases {
  readonly list: { name: string; ms: number }[] = [];
  private readonly start = performance.now();
  private last = this.start;

  mark(name: string): void {
    const now = performance.now();
    this.list.push({ name, ms: now - this.last });
    this.last = now;
  }

  /** `total;dur=…` (named by the caller) first, then every phase. */
  header(total: string): string {
    return [{ name: total, ms: performance.now() - this.start }, ...this.list]
      .map((p) => `${p.name};dur=${p.ms.toFixed(1)}`)
      .join(', ');
  }
}
