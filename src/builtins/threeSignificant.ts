// A number as value descriptions show it: three significant digits, without trailing zeros
// (common practice, no source).

/** x rounded to 3 significant digits, as the shortest text that reads back as that value. */
export function threeSignificant(x: number): string {
  return Number(x.toPrecision(3)).toString();
}
