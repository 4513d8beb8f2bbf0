import { writeFileSync } from 'node:fs';
import { mathFactoriesModule } from './mathFactorySelection';

writeFileSync(new URL('../src/sheet/mathFactories.ts', import.meta.url), await mathFactoriesModule());
console.log('src/sheet/mathFactories.ts written');
