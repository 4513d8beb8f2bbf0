// import('virtual:builtin-groups'): the built-ins in groups loaded on demand (scripts/builtinGroupsInApp.mjs).
declare module 'virtual:builtin-groups' {
  export const builtinGroups: import('./engine/lazyBuiltins').LazyBuiltins;
  /** The groups the demo's first result needs. */
  export const demoFirstGroups: readonly string[];
}
// import('virtual:deferred-math'): mathjs's factories loaded when a formula names them or after the first results (scripts/deferredMathInApp.mjs).
declare module 'virtual:deferred-math' {
  const factories: Record<string, unknown>;
  export default factories;
}
// import('virtual:demo-first-builtins'): the groups of built-ins the demo's first result needs, [file, built-ins] (page only).
declare module 'virtual:demo-first-builtins' {
  export const firstBuiltins: ReadonlyArray<readonly [string, readonly import('../src/sheet/builtin').Builtin[]]>;
}
