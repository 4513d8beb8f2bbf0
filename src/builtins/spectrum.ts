import type { Builtin } from '../sheet/builtin';

export const spectrumBuiltins: Builtin[] = [];
