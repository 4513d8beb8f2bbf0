import type { Builtin } from '../sheet/builtin';

export const statisticsBuiltins: Builtin[] = [];
