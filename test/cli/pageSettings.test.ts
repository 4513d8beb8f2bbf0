// The command line shares the plot modules with the app (`strainsheet plot`); loading them must not
// give the command line the page's settings (a budget of 0.1 s per cell with hand-off, which would
// leave slow cells without a value). Regression test for issue 10, item 1.
import { describe, expect, it } from 'vitest';
import { cellBudgetSeconds, DEFAULT_CELL_SECONDS, handOffOnTimeout } from '../../src/sheet/evaluationBudget';

describe('the command line keeps its own evaluation settings', () => {
  it('after loading the plot command (and the app modules it shares), the budget is the default and nothing is handed off', async () => {
    await import('../../src/cli/plotCommand');
    await import('../../web/plots/sheetSpectrumModel');
    expect(cellBudgetSeconds()).toBe(DEFAULT_CELL_SECONDS);
    expect(handOffOnTimeout()).toBe(false);
  });
});
