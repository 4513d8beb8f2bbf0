import { describe, it, expect } from 'vitest';
import SummaryReporter from './summaryReporter';

// The CI summary line must count what vitest reports (checked on hand-made module records).
describe('summary reporter', () => {
  it('counts passed, failed and skipped tests', () => {
    const tests = ['passed', 'failed', 'skipped', 'passed'].map((state) => ({ result: () => ({ state }) }));
    const mod = { state: () => 'failed', children: { allTests: () => tests[Symbol.iterator]() } };
    let out = '';
    const write = process.stdout.write;
    process.stdout.write = ((s: string) => ((out += s), true)) as typeof process.stdout.write;
    try {
      new SummaryReporter().onTestRunEnd([mod as never]);
    } finally {
      process.stdout.write = write;
    }
    expect(out.trim()).toBe('tests: 2 passed, 1 failed, 1 skipped');
  });
});
