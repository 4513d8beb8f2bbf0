import type { Plugin } from 'vite';
export interface DeferredMathPlan {
  exports: string[];
  entries: Array<{ exportName: string; fn: string; meta?: unknown }>;
  triggers: string[];
}
export function deferredMathPlan(): Promise<DeferredMathPlan>;
export function withDeferredFactories(code: string, plan: DeferredMathPlan): string;
export function deferredMathInApp(): Plugin;
