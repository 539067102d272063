/** Ends the run with one plain line, "tests: N passed, N failed, N skipped", that any CI can read. */
import type { Reporter, TestModule } from 'vitest/node';

export default class SummaryReporter implements Reporter {
  private line = '';

  onTestRunEnd(modules: ReadonlyArray<TestModule>): void {
    const count = { passed: 0, failed: 0, skipped: 0 };
    for (const m of modules) {
      for (const t of m.children.allTests()) {
        const state = t.result().state;
        if (state === 'passed') count.passed++;
        else if (state === 'failed') count.failed++;
        else count.skipped++;
      }
    }
    this.line = `tests: ${count.passed} passed, ${count.failed} failed, ${count.skipped} skipped`;
    // The default reporter writes its summary after this hook; print ours once the process is done with it.
    process.once('exit', () => process.stdout.write(`\n${this.line}\n`));
  }
}
