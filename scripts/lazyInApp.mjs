// Whether a Vite run builds the app with its parts loaded on demand (built-in groups, mathjs's
// solvers): the app's build (also when a test builds it) and development server, not vitest's
// module runner (mode 'test' for tests, 'benchmark' for `vitest bench`), where the engine is eager.

/** @param {import('vite').ConfigEnv} env */
export function loadsLazily(env) {
  return env.command === 'build' || (env.mode !== 'test' && env.mode !== 'benchmark');
}
