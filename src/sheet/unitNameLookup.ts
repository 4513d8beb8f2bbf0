// Whether a name is a unit (with or without a prefix), found by the name's own suffixes instead of
// mathjs's scan of every unit (Unit.isValuelessUnit runs `endsWith` against each of the ~350 units
// for every name that is not one: every built-in imported, every cell name checked and every
// symbol of a formula). Same answer: a name is a unit when it is one, or when it ends with a unit
// whose prefixes hold the rest (mathjs 15.2.0, lib/esm/type/unit/Unit.js, _findUnit).

interface UnitTable {
  [name: string]: { prefixes: Record<string, unknown> };
}

const own = (o: object, key: string) => Object.prototype.hasOwnProperty.call(o, key);

/** isValuelessUnit over `units` (read at each call, so units created later are seen). */
export function unitNameLookup(units: UnitTable): (name: string) => boolean {
  return (name: string) => {
    if (own(units, name)) return true;
    for (let k = 1; k <= name.length; k++) {
      const unitName = name.slice(k);
      if (own(units, unitName) && own(units[unitName].prefixes, name.slice(0, k))) return true;
    }
    return false;
  };
}
