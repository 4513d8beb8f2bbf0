import type { Builtin } from '../sheet/builtin';

export const utilityBuiltins: Builtin[] = [];
