// A small parser for `command FILE --flag --name value --name=value` command lines.

export interface OptionSpec {
  /** Options that take no value. */
  flags: readonly string[];
  /** Options that take a value; repeatable ones collect every occurrence. */
  values: readonly string[];
}

export interface ParsedOptions {
  positional: string[];
  flags: Set<string>;
  values: Map<string, string[]>;
}

export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}

export function parseOptions(args: readonly string[], spec: OptionSpec): ParsedOptions {
  const out: ParsedOptions = { positional: [], flags: new Set(), values: new Map() };
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    if (a === '--') {
      out.positional.push(...args.slice(i + 1));
      break;
    }
    if (!a.startsWith('--') || a === '-') {
      if (a.startsWith('-') && a !== '-') throw new UsageError(`unknown option ${a}`);
      out.positional.push(a);
      continue;
    }
    const eq = a.indexOf('=');
    const name = eq > 0 ? a.slice(2, eq) : a.slice(2);
    if (spec.flags.includes(name)) {
      if (eq > 0) throw new UsageError(`--${name} takes no value`);
      out.flags.add(name);
    } else if (spec.values.includes(name)) {
      let value: string | undefined;
      if (eq > 0) value = a.slice(eq + 1);
      else {
        value = args[++i];
        if (value === undefined) throw new UsageError(`--${name} needs a value`);
      }
      const list = out.values.get(name) ?? [];
      list.push(value);
      out.values.set(name, list);
    } else {
      throw new UsageError(`unknown option --${name}`);
    }
  }
  return out;
}
