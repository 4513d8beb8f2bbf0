// The private mathjs instance every formula is evaluated with, built from only the factories the
// formula language needs (mathFactories.ts), so that start-up and bundles stay small. Astronomers'
// units are defined here before the instance is locked (see formulaCompiler for the allow-list).
import { create, type MathJsInstance, type Unit } from 'mathjs';
import { M_SUN_KG, AU_M, PC_M, YEAR_S } from '../physics/constants';
import { MATH_FACTORIES, OMITTED_MATHJS_NAMES } from './mathFactories';
import { unitNameLookup } from './unitNameLookup';
import { withDependenciesCalledOnUse } from './lazyFactoryDependencies';

function buildInstance(): MathJsInstance {
  // absTol 0: mathjs's default absolute tolerance would make 1e-15 == 0 true.
  const m = create(withDependenciesCalledOnUse(MATH_FACTORIES), { absTol: 0, relTol: 1e-12 });
  // mathjs asks this for every name imported, every symbol parsed and every cell name checked.
  const unitClass = m.Unit as unknown as { isValuelessUnit(name: string): boolean; UNITS: Parameters<typeof unitNameLookup>[0] };
  unitClass.isValuelessUnit = unitNameLookup(unitClass.UNITS);
  // Units of the trade (values from src/physics/constants.ts, each with its source there).
  m.createUnit('Msun', { definition: `${M_SUN_KG} kg` });
  m.createUnit('au', { definition: `${AU_M} m` });
  m.createUnit('pc', { definition: `${PC_M} m` });
  m.createUnit('kpc', { definition: `${1e3 * PC_M} m` });
  m.createUnit('Mpc', { definition: `${1e6 * PC_M} m` });
  m.createUnit('Gpc', { definition: `${1e9 * PC_M} m` });
  m.createUnit('yr', { definition: `${YEAR_S} s` }); // Julian year
  m.createUnit('Myr', { definition: `${1e6 * YEAR_S} s` });
  m.createUnit('Gyr', { definition: `${1e9 * YEAR_S} s` });
  return m;
}

/** The shared instance. Built-ins are imported and the instance is locked by the formula compiler. */
export const math: MathJsInstance = buildInstance();

/** Parsed unit texts of quantity(), kept (units are fixed once the instance is locked; never handed out). */
const parsedUnits = new Map<string, Unit>();

/** A quantity in SI with the given unit text, e.g. quantity(3.1e22, 'm'). */
export function quantity(valueSI: number, unitText: string): Unit {
  let u = parsedUnits.get(unitText);
  if (!u) {
    u = math.unit(unitText);
    if (parsedUnits.size < 1000) parsedUnits.set(unitText, u);
  }
  // mathjs stores a unit's value in SI base units; set it directly to avoid rounding twice.
  const q = u.clone() as Unit & { value: number; fixPrefix: boolean };
  q.value = valueSI;
  return q;
}

/**
 * Whether a name belongs to mathjs's full namespace (inherited object properties included), also
 * when this instance leaves it out: such names stay refused in formulas and as cell names.
 */
export function isMathjsName(name: string): boolean {
  return name in math || OMITTED_MATHJS_NAMES.has(name);
}

export function isUnit(v: unknown): v is Unit {
  return math.isUnit(v);
}
