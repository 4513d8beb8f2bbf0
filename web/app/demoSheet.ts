// The built-in demo sheet (examples/demo.json, an invented scenario), bundled as text.
// Read through import.meta.glob so that a missing file gives a message instead of a broken build.
const found = import.meta.glob('../../examples/demo.json', { query: '?raw', import: 'default', eager: true }) as Record<string, string>;

export const DEMO_TEXT: string | null = Object.values(found)[0] ?? null;
