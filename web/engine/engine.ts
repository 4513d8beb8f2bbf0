// The one place the web app imports the sheet engine from src/ (the engine never imports the DOM).
export { Sheet } from '../../src/sheet/sheet';
export { formatValue } from '../../src/sheet/formatValue';
export { sheetTextFromBytes } from '../../src/sheet/sheetFile';
export { isSheetObject, type SheetObject } from '../../src/sheet/sheetObject';
export { isOffPageValue } from '../../src/sheet/offPageValue';
export type { CellSpec, CellState, SheetObserver } from '../../src/sheet/types';
export type { CellError } from '../../src/sheet/cellError';
export type { Builtin, BuiltinArg } from '../../src/sheet/builtin';
