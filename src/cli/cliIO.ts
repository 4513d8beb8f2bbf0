// Where a command writes: standard output and standard error, replaceable in tests.

export interface CliIO {
  out(text: string): void;
  err(text: string): void;
}

export const processIO: CliIO = {
  out: (text) => void process.stdout.write(text),
  err: (text) => void process.stderr.write(text),
};
