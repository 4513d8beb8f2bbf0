// A large sheet for the large-sheet checks (browser test and UI benchmark): chains of arithmetic
// cells with units, in sections of 500 cells, every 50th cell with a note. Built from the count
// alone, so every run opens the same file.

/** The text of a sheet file with `count` cells (count a multiple of 10). */
export function bigSheetText(count: number): string {
  const cells: Record<string, string>[] = [];
  const chain = 10; // cells per chain: a head with a unit, then arithmetic on the cell before
  for (let i = 0; i < count; i++) {
    const k = i % chain;
    const name = `c${i}`;
    let formula: string;
    if (k === 0) formula = `${(i % 97) + 1}.5 m`;
    else if (k % 3 === 1) formula = `c${i - 1} * 2 + 1 m`;
    else if (k % 3 === 2) formula = `c${i - 1} / 3 s`;
    else formula = `c${i - 1} * 4 s - c${i - 2}`;
    const cell: Record<string, string> = { name, formula, section: `part ${Math.floor(i / 500) + 1}` };
    if (i % 50 === 0) cell.note = `head of chain ${i / chain}`;
    cells.push(cell);
  }
  return `${JSON.stringify({ format: 'strainsheet', version: 1, title: `${count} cells`, notes: '', cells }, null, 2)}\n`;
}
