// `import url from './x.ts?shared-worker-url'`: scripts/sharedWorkerEntries.mjs.
declare module '*?shared-worker-url' {
  const url: string;
  export default url;
}
