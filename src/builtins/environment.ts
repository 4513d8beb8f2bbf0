import type { Builtin } from '../sheet/builtin';

export const environmentBuiltins: Builtin[] = [];
