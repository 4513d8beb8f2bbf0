import { writeFileSync } from 'node:fs';
import { allBuiltins } from '../src/builtins/index';
import { builtinReference } from './builtinReference';

writeFileSync(new URL('../docs/builtins.md', import.meta.url), builtinReference(allBuiltins()));
console.log(`docs/builtins.md: ${allBuiltins().length} built-ins`);
