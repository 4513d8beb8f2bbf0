// The mathjs functions a formula may call. Everything not listed here (and not a built-in or a
// function cell) is refused before compilation. Left out on purpose: anything that parses or
// evaluates text, changes the instance or creates units (import, createUnit, evaluate, parse,
// compile, simplify, derivative, resolve, reviver, chain, help, config, ...); functions whose
// output size or running time grows without bound from a small argument (zeros, ones, identity,
// range, kron, resize, combinations, permutations, setPowerset, ...); random numbers (the
// statistics built-ins own seeded sampling); and text formatting. `gamma` is left out so that
// the trade's spectral index can be a cell named gamma (lgamma and factorial remain). subset and
// index are left out because an index of text reads an object's property (v[2] indexing remains).

export const ALLOWED_MATH_FUNCTIONS: ReadonlySet<string> = new Set([
  // arithmetic
  'abs', 'add', 'subtract', 'multiply', 'divide', 'unaryMinus', 'unaryPlus', 'mod', 'pow', 'sqrt', 'cbrt',
  'nthRoot', 'square', 'cube', 'exp', 'expm1', 'log', 'log10', 'log2', 'log1p', 'sign', 'floor', 'ceil',
  'round', 'fix', 'hypot', 'gcd', 'lcm', 'dotMultiply', 'dotDivide', 'dotPow', 'factorial', 'lgamma', 'erf',
  // trigonometry
  'sin', 'cos', 'tan', 'sec', 'csc', 'cot', 'asin', 'acos', 'atan', 'atan2', 'asec', 'acsc', 'acot',
  'sinh', 'cosh', 'tanh', 'asinh', 'acosh', 'atanh',
  // complex numbers
  're', 'im', 'conj', 'arg',
  // comparison and logic
  'equal', 'unequal', 'larger', 'largerEq', 'smaller', 'smallerEq', 'compare', 'deepEqual', 'and', 'or',
  'not', 'xor', 'isNaN', 'isInteger', 'isPositive', 'isNegative', 'isZero', 'isFinite',
  // statistics on lists
  'min', 'max', 'sum', 'prod', 'mean', 'median', 'std', 'variance', 'mad', 'cumsum', 'quantileSeq',
  // lists and matrices (output no larger than the input, or bounded by the inputs' product)
  'size', 'count', 'concat', 'transpose', 'flatten', 'squeeze', 'sort', 'diff', 'dot', 'cross', 'norm',
  'det', 'inv', 'trace', 'lusolve', 'reshape', 'matrix', 'row', 'column',
  'map', 'forEach', 'filter',
  // conversion
  'to', 'number',
]);

/** Constants a formula may name (mathjs constants; physical constants come from the built-ins). */
export const ALLOWED_CONSTANTS: ReadonlySet<string> = new Set([
  'pi', 'e', 'tau', 'phi', 'i', 'Infinity', 'NaN', 'true', 'false', 'null',
  'LN2', 'LN10', 'LOG2E', 'LOG10E', 'SQRT2', 'SQRT1_2', 'PI', 'E',
]);

/** Functions of the mathjs instance that are replaced by throwing stubs when the instance is locked. */
export const LOCKED_FUNCTIONS: readonly string[] = [
  'import', 'createUnit', 'evaluate', 'parse', 'compile', 'simplify', 'simplifyConstant', 'simplifyCore',
  'derivative', 'resolve', 'reviver', 'replacer', 'chain', 'help', 'parser', 'rationalize', 'leafCount',
  'symbolicEqual',
];
