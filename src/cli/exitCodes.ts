// Exit codes of every command.
/** Everything evaluated. */
export const EXIT_OK = 0;
/** The sheet was read but at least one cell has an error. */
export const EXIT_CELL_ERROR = 1;
/** The file could not be read or is not a valid sheet, or the command line is wrong. */
export const EXIT_BAD_INPUT = 2;
