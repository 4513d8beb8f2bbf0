// A callback that long loops of physics and statistics call at a coarse step (once per frequency
// bin, per table row, per block of samples). The sheet's built-ins pass one that throws when the
// cell's time budget is used up on the app's page (src/sheet/evaluationBudget.ts,
// checkTimeNowIfHandingOff), so a slow call is handed off; everywhere else it does nothing.
export type TimeCheck = () => void;

/** The check of callers that are not timed (the default). */
export const NO_TIME_CHECK: TimeCheck = () => {};
