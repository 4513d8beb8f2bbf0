// import('virtual:builtin-docs'): every built-in's documentation (scripts/builtinDocsInApp.mjs).
declare module 'virtual:builtin-docs' {
  const docs: Array<Omit<import('../src/sheet/builtin').Builtin, 'fn'>>;
  export default docs;
}
