import type { BuildOptions } from 'esbuild';
/** Options for esbuild's build(), writing into `outdir`. */
export function cliBuildOptions(outdir: string): BuildOptions;
