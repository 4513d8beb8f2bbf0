// Prepares the shared mathjs instance for formulas, once: imports every built-in as a raw
// function, keeps private references to the parser, puts the size guards where formulas look
// names up, then replaces the functions that could change the instance or evaluate text with
// stubs that throw. Done lazily on first use so that built-in modules (which import the
// instance) finish loading first. mathjs functions are still built on first use, so start-up
// pays only for the ones a sheet calls.
import type { MathNode } from 'mathjs';
import { math } from './mathInstance';
import { allBuiltins } from '../builtins/index';
import type { Builtin } from './builtin';
import { LOCKED_FUNCTIONS } from './allowedFunctions';
import { guardedRangeTransform, sizeGuardedFunctions, sizeGuardedTransforms } from './sizeGuards';

export interface LockedMath {
  /** mathjs's parser, kept before the instance was locked. */
  parse(text: string): MathNode;
  /** Built-ins by name. */
  builtins: ReadonlyMap<string, Builtin>;
  /** Problems met while importing built-ins (a name clash), reported to developers. */
  importProblems: string[];
}

let locked: LockedMath | undefined;

/** Message of the stubs that replace the locked functions. */
export function lockedMessage(name: string): string {
  return `${name} is not available in Strainsheet formulas`;
}

export function lockedMath(): LockedMath {
  if (locked) return locked;
  const parse = math.parse.bind(math) as (text: string) => MathNode;
  const builtins = new Map<string, Builtin>();
  const importProblems: string[] = [];
  for (const b of allBuiltins()) {
    if (builtins.has(b.name)) {
      importProblems.push(`built-in ${b.name} is defined twice; the first is kept`);
      continue;
    }
    try {
      math.import({ [b.name]: b.fn }, { override: false });
      builtins.set(b.name, b);
    } catch (e) {
      importProblems.push(`built-in ${b.name} could not be added: ${(e as Error).message}`);
    }
  }
  // mathjs builds each function on first use. The size guards replace list arithmetic only where
  // formulas look names up (the expression namespace); mathjs functions built later still get the
  // plain functions they depend on, as they would have before the guards were put in place.
  const withTransform = (math as unknown as { expression: { mathWithTransform: Record<string, unknown> } }).expression
    .mathWithTransform;
  const guards: Record<string, unknown> = { ...sizeGuardedFunctions(), ...sizeGuardedTransforms(), range: guardedRangeTransform() };
  for (const [name, guard] of Object.entries(guards)) {
    Object.defineProperty(withTransform, name, { value: guard, writable: true, configurable: true, enumerable: true });
  }
  const stubs: Record<string, () => never> = {};
  for (const name of LOCKED_FUNCTIONS) {
    stubs[name] = () => {
      throw new Error(lockedMessage(name));
    };
  }
  // `import` must be replaced last, by the import call itself.
  const { import: importStub, ...others } = stubs;
  math.import(others, { override: true });
  math.import({ import: importStub }, { override: true });
  // config() may still be read (returns a copy) but never changed. Its read-only properties
  // (config.relTol, ...) stay, for the mathjs functions built after the lock.
  const original = math.config as unknown as (() => unknown) & object;
  const readConfig = original.bind(math) as () => unknown;
  const lockedConfig = (options?: unknown) => {
    if (options !== undefined) throw new Error(lockedMessage('config'));
    return readConfig();
  };
  for (const [key, descriptor] of Object.entries(Object.getOwnPropertyDescriptors(original))) {
    if (!(key in lockedConfig)) Object.defineProperty(lockedConfig, key, descriptor);
  }
  (math as unknown as { config: unknown }).config = lockedConfig;
  locked = { parse, builtins, importProblems };
  return locked;
}
