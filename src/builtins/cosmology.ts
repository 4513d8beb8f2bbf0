import type { Builtin } from '../sheet/builtin';

export const cosmologyBuiltins: Builtin[] = [];
