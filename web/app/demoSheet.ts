// The built-in demo sheet (examples/demo.json, an invented scenario), shipped as a data file of
// its own and fetched at start, so that it is not part of the JavaScript the page loads. Found
// through import.meta.glob so that a missing file gives a message instead of a broken build.
import { builtinGroups } from 'virtual:builtin-groups';
import { firstBuiltins } from 'virtual:demo-first-builtins';

// The groups of built-ins the demo's first result needs are part of the page's own chunks.
for (const [group, builtins] of firstBuiltins) builtinGroups.provide(group, builtins);

const found = import.meta.glob('../../examples/demo.json', { query: '?url', import: 'default', eager: true }) as Record<string, string>;
const DEMO_URL: string | null = Object.values(found)[0] ?? null;

async function fetchDemo(): Promise<string | null> {
  if (DEMO_URL === null) return null;
  const response = await fetch(DEMO_URL);
  if (!response.ok) throw new Error(`${response.status} ${response.statusText}`);
  return response.text();
}

/** Whether the page will start on the demo (no autosave; web/files/autosave.ts's key), read without importing it. */
function startsOnDemo(): boolean {
  try {
    return window.localStorage?.getItem('strainsheet:autosave:v1') == null;
  } catch {
    return false;
  }
}

// Asked for as this module loads (main.tsx imports it first; index.html preloads it).
let early: Promise<string | null> | null = startsOnDemo() ? fetchDemo() : null;
let arrived: string | null | undefined;
const settled: Promise<unknown> = early ? early.then((t) => void (arrived = t), () => {}) : Promise.resolve();

/** Resolves once the demo's text asked for at start has arrived or failed (at once when none was). */
export async function demoSettled(): Promise<void> {
  await settled;
}

/** The demo's text asked for at start if it has arrived (once; null when this build has none), else undefined. */
export function arrivedDemoText(): string | null | undefined {
  const text = arrived;
  if (text !== undefined) {
    arrived = undefined;
    early = null;
  }
  return text;
}

/** The demo sheet's text, or null when this build has none; rejects when it cannot be fetched. */
export function demoText(): Promise<string | null> {
  const text = early ?? fetchDemo();
  early = null;
  return text;
}
