// The scope a function cell's body is evaluated with: its parameters bound to one call's
// arguments, other names read from the cell's inputs. Shaped like a Map so mathjs accepts it,
// and allocated per call without copying the inputs (function cells are called from integrands).

export class FunctionCellScope {
  constructor(
    private readonly params: readonly string[],
    private readonly args: readonly unknown[],
    private readonly inputs: ReadonlyMap<string, unknown>,
  ) {}

  private indexOf(name: string): number {
    const p = this.params;
    for (let i = 0; i < p.length; i++) if (p[i] === name) return i;
    return -1;
  }

  get(name: string): unknown {
    const i = this.indexOf(name);
    return i >= 0 ? this.args[i] : this.inputs.get(name);
  }

  has(name: string): boolean {
    return this.indexOf(name) >= 0 || this.inputs.has(name);
  }

  set(name: string): never {
    throw new Error(`${name} cannot be assigned inside a function cell`);
  }

  keys(): IterableIterator<string> {
    return new Set([...this.params, ...this.inputs.keys()]).values();
  }
}
