// Which names a cell may have, and why a refused name is refused (the UI shows the reason and a
// suggested alternative). A cell name must never shadow a unit, constant or function, nor reach
// a JavaScript prototype property.
import { isMathjsName, math } from './mathInstance';
import { ALLOWED_CONSTANTS, ALLOWED_MATH_FUNCTIONS, LOCKED_FUNCTIONS } from './allowedFunctions';

export interface NameVerdict {
  ok: boolean;
  /** Why the name is refused (absent when ok). */
  reason?: string;
  /** A valid alternative (absent when ok). */
  suggestion?: string;
}

/** Longest cell name accepted. */
export const MAX_NAME_LENGTH = 64;

const IDENTIFIER = /^[A-Za-z_][A-Za-z0-9_]*$/;

// Words of the mathjs expression syntax and of JavaScript (ECMA-262 reserved words).
const RESERVED_WORDS = new Set([
  'to', 'in', 'mod', 'not', 'and', 'or', 'xor', 'end', 'undefined',
  'break', 'case', 'catch', 'class', 'const', 'continue', 'debugger', 'default', 'delete', 'do', 'else',
  'enum', 'export', 'extends', 'finally', 'for', 'function', 'if', 'import', 'instanceof', 'new',
  'return', 'super', 'switch', 'this', 'throw', 'try', 'typeof', 'var', 'void', 'while', 'with', 'yield',
  'let', 'static', 'implements', 'interface', 'package', 'private', 'protected', 'public', 'await',
  'async', 'eval', 'arguments', 'globalThis', 'window', 'self', 'document', 'process', 'require', 'module',
]);

// Properties every object or function has; a cell of such a name could be confused with them.
const PROTOTYPE_NAMES = new Set([
  ...Object.getOwnPropertyNames(Object.prototype),
  ...Object.getOwnPropertyNames(Function.prototype),
  'prototype', '__proto__', 'constructor',
]);

// Names of the mathjs namespace that formulas cannot reach, left free for cells because the trade
// uses them (gamma is the spectral index of a timing-residual power law).
export const FREE_NAMES: ReadonlySet<string> = new Set(['gamma', 'distance', 'range', 'mode', 'zeta', 'random']);

// Alternatives for refused names that people of the trade are likely to type.
const TRADE_ALTERNATIVES: Record<string, string> = {
  T: 'T_span', t: 't_obs', e: 'ecc', h: 'h_dimless', H: 'H_scale', m: 'm_1', g: 'g_factor', s: 's_sep',
  A: 'A_amp', N: 'N_psr', K: 'K_coef', L: 'L_gw', J: 'J_n', W: 'W_fn', G: 'G_newton', c: 'c_light',
  pc: 'pc_dist', yr: 'T_yr', Msun: 'M_sun', i: 'i_incl', sigma: 'sigma_v', beta: 'beta_z', alpha: 'alpha_M',
};

function isUnitName(name: string): boolean {
  try {
    return math.Unit.isValuelessUnit(name);
  } catch {
    return false;
  }
}

function suggestFor(name: string, isValid: (n: string) => boolean): string {
  const candidates = [TRADE_ALTERNATIVES[name], `${name}_value`, `${name}_1`, `my_${name}`, 'cell_1'];
  for (const c of candidates) if (c && IDENTIFIER.test(c) && c.length <= MAX_NAME_LENGTH && isValid(c)) return c;
  return 'cell_1';
}

/**
 * Checks a proposed cell name. `builtinNames` are the sheet's built-ins (passed in so this file
 * does not load them).
 */
export function checkCellName(name: unknown, builtinNames: ReadonlySet<string> = new Set()): NameVerdict {
  const reasonFor = (n: string): string | undefined => {
    if (n.length === 0) return 'a cell name cannot be empty';
    if (n.length > MAX_NAME_LENGTH) return `a cell name can have at most ${MAX_NAME_LENGTH} characters`;
    if (!IDENTIFIER.test(n)) {
      return /^[0-9]/.test(n)
        ? 'a cell name cannot start with a digit'
        : 'a cell name may contain only letters A-Z, a-z, digits and _';
    }
    if (PROTOTYPE_NAMES.has(n)) return `${n} is a JavaScript object property name`;
    if (RESERVED_WORDS.has(n)) return `${n} is a reserved word`;
    if (ALLOWED_CONSTANTS.has(n)) return `${n} is a mathematical constant`;
    if (isUnitName(n)) return `${n} is a unit name (formulas read ${n} as a unit)`;
    if (ALLOWED_MATH_FUNCTIONS.has(n)) return `${n} is the name of a function formulas can call`;
    if (builtinNames.has(n)) return `${n} is the name of a built-in function`;
    if (LOCKED_FUNCTIONS.includes(n) || (isMathjsName(n) && !FREE_NAMES.has(n))) return `${n} is a name of the formula language`;
    return undefined;
  };
  if (typeof name !== 'string') return { ok: false, reason: 'a cell name must be text', suggestion: 'cell_1' };
  const reason = reasonFor(name);
  if (reason === undefined) return { ok: true };
  const base = name.replace(/[^A-Za-z0-9_]/g, '_').replace(/^([0-9])/, '_$1').slice(0, MAX_NAME_LENGTH - 6) || 'cell';
  return { ok: false, reason, suggestion: suggestFor(base, (c) => reasonFor(c) === undefined) };
}
