// How many Web Workers the app's chunk pool starts (webChunkPool.ts).

/** The number of logical cores the browser reports (at least 1, at most 16). */
export function webWorkerCount(): number {
  const n = (globalThis as { navigator?: { hardwareConcurrency?: number } }).navigator?.hardwareConcurrency ?? 1;
  return Math.max(1, Math.min(16, Math.floor(n)));
}
