import type { Builtin } from '../sheet/builtin';

export const arrayViewBuiltins: Builtin[] = [];
