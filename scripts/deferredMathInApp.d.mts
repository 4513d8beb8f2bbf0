import type { Plugin } from 'vite';
export interface DeferredMathPlan {
  exports: string[];
  entries: Array<{ exportName: string; fn: string; meta?: unknown; transform: boolean; rawArgs: boolean }>;
  triggers: string[];
  symbols: string[];
}
export const OPERATOR_TEXT: Record<string, string[]>;
export function namesCalledIn(dirs: string[]): Set<string>;
export function deferredSet(factories: Array<{ exportName: string; f: { fn: string; dependencies: string[] } }>, named: Set<string>, kept: Set<string>): { deferred: Set<string>; triggers: string[]; symbols: string[] };
export function deferredMathPlan(): Promise<DeferredMathPlan>;
export function withDeferredFactories(code: string, plan: DeferredMathPlan): string;
export function deferredMathInApp(): Plugin;
