import type { Builtin } from '../sheet/builtin';

export const orbitBuiltins: Builtin[] = [];
