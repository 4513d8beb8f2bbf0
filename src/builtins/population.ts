import type { Builtin } from '../sheet/builtin';

export const populationBuiltins: Builtin[] = [];
