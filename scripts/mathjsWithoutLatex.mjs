// mathjs's LaTeX output (Node.toTex, utils/latex.js: tables of every function's and operator's
// LaTeX, about 8 kB of the page's start) in the app: neither the engine nor the app calls
// toTex, so the app's build and development server give mathjs's expression nodes a module of
// the same exports whose tables are empty and whose functions throw, saying so. The command line
// and the tests use mathjs as it is.
import { loadsLazily } from './lazyInApp.mjs';

const LATEX = /[\\/]node_modules[\\/]mathjs[\\/]lib[\\/]esm[\\/]utils[\\/]latex\.js$/;
const RESOLVED = '\0strainsheet:mathjs-latex';
const STUB = `const unavailable = () => { throw new Error('LaTeX output of formulas is not part of the app'); };
export const latexSymbols = {};
export const latexOperators = {};
export const latexFunctions = {};
export const defaultTemplate = '';
export const escapeLatex = unavailable;
export const toSymbol = unavailable;
`;

/** @returns {import('vite').Plugin} */
export function mathjsWithoutLatex() {
  let lazy = false;
  return {
    name: 'strainsheet-mathjs-without-latex',
    enforce: 'pre',
    config(_config, env) {
      lazy = loadsLazily(env);
    },
    async resolveId(source, importer, options) {
      if (!lazy || !importer || !source.endsWith('latex.js') || !/[\\/]mathjs[\\/]lib[\\/]esm[\\/]/.test(importer)) return null;
      const resolved = await this.resolve(source, importer, { ...options, skipSelf: true });
      return resolved && LATEX.test(resolved.id) ? RESOLVED : null;
    },
    load(id) {
      return id === RESOLVED ? STUB : null;
    },
  };
}
