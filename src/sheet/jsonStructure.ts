// A pass over JSON text before it is parsed: how deeply it nests (JSON.parse recurses, so a file
// nested 100,000 deep would overflow the stack) and the first key repeated within one object
// (JSON.parse silently keeps the last value; RFC 8259 section 4 leaves duplicate names undefined).
// The pass is iterative and only looks at structure; JSON.parse still judges the syntax.

export interface JsonStructure {
  /** Deepest nesting of objects and arrays (a top-level object is depth 1). */
  depth: number;
  /** The first repeated key, with the path of the object holding it (keys and array indices). */
  duplicate?: { key: string; path: Array<string | number> };
}

interface Open {
  object: boolean;
  keys?: Set<string>;
  key?: string;
  index: number;
  expectKey: boolean;
}

/** Measures nesting and finds duplicated keys; stops early once the nesting exceeds `maxDepth`. */
export function jsonStructure(text: string, maxDepth = Infinity): JsonStructure {
  const stack: Open[] = [];
  let depth = 0;
  let duplicate: JsonStructure['duplicate'];
  let nextSlash = -1; // the first backslash at or after the search position (Infinity: none)
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 0x7b /* { */ || c === 0x5b /* [ */) {
      const object = c === 0x7b;
      stack.push({ object, keys: object ? new Set() : undefined, index: 0, expectKey: object });
      if (stack.length > depth) {
        depth = stack.length;
        if (depth > maxDepth) break;
      }
    } else if (c === 0x7d /* } */ || c === 0x5d /* ] */) {
      stack.pop();
    } else if (c === 0x2c /* , */) {
      const top = stack[stack.length - 1];
      if (top?.object) top.expectKey = true;
      else if (top) top.index++;
    } else if (c === 0x22 /* " */) {
      // the closing quote, found with indexOf (long strings are not walked character by character):
      // a backslash before it escapes the character after the backslash
      let j = i + 1;
      let escaped = false;
      for (;;) {
        const close = text.indexOf('"', j);
        if (nextSlash < j) nextSlash = slashAtOrAfter(text, j);
        if (nextSlash < (close < 0 ? text.length : close)) {
          escaped = true;
          j = nextSlash + 2;
          continue;
        }
        j = close < 0 ? Math.max(j, text.length) : close;
        break;
      }
      const top = stack[stack.length - 1];
      if (top?.object && top.expectKey && !duplicate) {
        let key = text.slice(i + 1, j);
        if (escaped) {
          try {
            key = JSON.parse(text.slice(i, j + 1)) as string;
          } catch {
            // JSON.parse will report the bad string
          }
        }
        if (top.keys!.has(key)) duplicate = { key, path: pathOf(stack) };
        top.keys!.add(key);
        top.key = key;
      }
      if (top?.object) top.expectKey = false;
      i = j;
    }
  }
  return duplicate ? { depth, duplicate } : { depth };
}

function slashAtOrAfter(text: string, from: number): number {
  const k = text.indexOf('\\', from);
  return k < 0 ? Infinity : k;
}

function pathOf(stack: Open[]): Array<string | number> {
  const path: Array<string | number> = [];
  for (let k = 0; k < stack.length - 1; k++) {
    const s = stack[k];
    path.push(s.object ? (s.key ?? '') : s.index);
  }
  return path;
}
