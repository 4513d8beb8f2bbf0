// Built-ins' own long loops check the cell budget where a slow cell is handed off (the app's page;
// issue 10, item 1): the finite-number bins, realisations, the free-spectrum and (A, gamma) KDE
// tables, the eccentric harmonic tables, the detection-span scan and the lifetimes of a population
// delayed by an environment, and built-ins applied to each element of a list. Inputs come from the demo sheet
// evaluated with the command line's settings, so the population is not a timed one (its density does
// not check the clock) and only the built-in's loop can stop the call. With a budget too short for
// anything the call stops with the budget's 'limit' error; with hand-off on and the command line's
// budget, and after a stopped call (no half-built table is kept), every value is bit-identical to
// the command line's (toEqual compares numbers with Object.is). Without hand-off nothing is stopped.
import { readFileSync } from 'node:fs';
import { afterEach, describe, expect, it } from 'vitest';
import { Sheet } from '../../src/sheet/sheet';
import { beginCell, DEFAULT_CELL_SECONDS, endCell, setCellBudget, setHandOffOnTimeout } from '../../src/sheet/evaluationBudget';
import { BuiltinError } from '../../src/sheet/cellError';
import { allBuiltins } from '../../src/builtins/index';
import { clearHarmonicSumTables } from '../../src/physics/eccentricKernel';
import { HarmonicSumTable } from '../../src/physics/eccentricHarmonicSum';
import { PAGE_REALISATION_BINS } from '../../src/builtins/realisations';

const demo = readFileSync(new URL('../../examples/demo.json', import.meta.url), 'utf8');
const builtins = new Map(allBuiltins().map((b) => [b.name, b]));

afterEach(() => {
  setHandOffOnTimeout(false);
  setCellBudget(DEFAULT_CELL_SECONDS);
});

/** A fresh demo sheet read with the command line's settings (objects built anew: no KDE table yet). */
function inputs(): (name: string) => unknown {
  const s = Sheet.fromFile(demo, { evaluateOnRead: true });
  return (name) => {
    const v = s.value(name);
    if (v === undefined) throw new Error(`demo cell ${name} has no value`);
    return v;
  };
}

/** Calls a built-in as a cell's evaluation does (its clock starts at its first check). */
function call(name: string, ...args: unknown[]): unknown {
  const fn = builtins.get(name)!.fn as (...a: unknown[]) => unknown;
  const mark = beginCell();
  try {
    return fn(...args);
  } finally {
    endCell(mark);
  }
}

/** Plain data of a value: numbers of matrices and Float64Arrays, units' SI value, objects' JSON. */
function plain(v: unknown): unknown {
  const o = v as { toArray?: () => unknown; toJSON?: () => unknown; value?: number; units?: unknown };
  if (o && typeof o.toArray === 'function') return o.toArray();
  if (o && o.units !== undefined && typeof o.value === 'number') return o.value;
  if (o && typeof o.toJSON === 'function') return JSON.parse(JSON.stringify(o.toJSON()));
  return v;
}

function stopsOnPage(run: () => unknown): void {
  setHandOffOnTimeout(true);
  setCellBudget(1e-9); // so short that any second check of the clock fails
  let error: unknown;
  try {
    run();
  } catch (e) {
    error = e;
  }
  expect(error).toBeInstanceOf(BuiltinError);
  expect((error as BuiltinError).kind).toBe('limit');
  expect((error as BuiltinError).message).toMatch(/ran longer than its time budget/);
  setCellBudget(DEFAULT_CELL_SECONDS); // hand-off stays on: the page's checks run, with the command line's budget
}

describe("built-ins' loops and the page's cell budget", () => {
  it('binariesPerBin, thinnedSpectrum, loudestBinaryStrain and longResidenceShare with an environment stop on the page, per bin', () => {
    const get = inputs();
    const args = [get('pop'), get('freqs'), get('array_span'), get('stellar_environment')];
    const names = ['binariesPerBin', 'thinnedSpectrum', 'loudestBinaryStrain', 'longResidenceShare'];
    // The reference of each (command line), then a call without the environment so that the last
    // computation kept (orbits.ts finiteBins) is another one and every call below computes anew.
    const reference = names.map((n) => {
      const r = plain(call(n, ...args));
      call(n, ...args.slice(0, 3));
      return r;
    });
    names.forEach((n, i) => {
      stopsOnPage(() => call(n, ...args));
      expect(plain(call(n, ...args)), n).toEqual(reference[i]);
      call(n, ...args.slice(0, 3));
    });
  });

  it('GW-driven, the cuts (thinnedSpectrum) and loudest binaries (loudestBinaryStrain) computed when first read stop on the page, per bin, and are computed whole later', () => {
    const get = inputs();
    const args = [get('pop'), get('freqs'), get('array_span')];
    for (const n of ['thinnedSpectrum', 'loudestBinaryStrain']) {
      const reference = plain(call(n, ...args));
      call('binariesPerBin', ...args, get('stellar_environment')); // another computation kept (orbits.ts finiteBins)
      call('binariesPerBin', ...args); // the bins set up anew, the fields not read yet
      stopsOnPage(() => call(n, ...args));
      expect(plain(call(n, ...args)), n).toEqual(reference);
    }
  });

  it('realiseBackground: a small run goes to the end on the page (its plot reads the draws), a large one stops (cells and summary per bin, draws per realisation); realisedQuantile stops per bin', () => {
    const get = inputs();
    const freqs = get('freqs') as { size(): number[] };
    const bins = freqs.size()[0];
    const small = Math.floor(PAGE_REALISATION_BINS / bins);
    const args = [get('pop'), get('freqs'), get('array_span'), small, 7, undefined, undefined, get('stellar_environment')];
    const reference = plain(call('realiseBackground', ...args));
    setHandOffOnTimeout(true);
    setCellBudget(1e-9); // the page's checks, with a budget too short for any of them
    const onPage = call('realiseBackground', ...args);
    setCellBudget(DEFAULT_CELL_SECONDS);
    expect(plain(onPage)).toEqual(reference);
    const large = [get('pop'), get('freqs'), get('array_span'), small + 1, 7, undefined, undefined, get('stellar_environment')];
    const largeReference = plain(call('realiseBackground', ...large));
    stopsOnPage(() => call('realiseBackground', ...large));
    expect(plain(call('realiseBackground', ...large))).toEqual(largeReference);
    const realisations = call('realiseBackground', ...args);
    expect(plain(realisations)).toEqual(reference);
    // realisedQuantile sorts each bin's column of realisations: once per bin.
    setHandOffOnTimeout(false); // the command line's
    const median = plain(call('realisedQuantile', realisations, 0.5));
    stopsOnPage(() => call('realisedQuantile', realisations, 0.5));
    expect(plain(call('realisedQuantile', realisations, 0.5))).toEqual(median);
  });

  it("the free-spectrum likelihood's KDE tables stop on the page, per bin, and are built whole later", () => {
    const get = inputs();
    const spectrum = get('spectrum');
    const reference = call('freeSpectrumLogLikelihood', spectrum, get('measured_free_spectrum'));
    const measured = inputs()('measured_free_spectrum'); // its tables not built yet
    stopsOnPage(() => call('freeSpectrumLogLikelihood', spectrum, measured));
    expect(call('freeSpectrumLogLikelihood', spectrum, measured)).toEqual(reference);
  });

  it("the (A, gamma) region's 2-D KDE stops on the page, per grid row, and is built whole later", () => {
    const get = inputs();
    const args = [get('spectrum'), get('measured_free_spectrum'), get('measured_A_gamma')];
    const reference = plain(call('effectiveAmplitudeGamma', ...args));
    const fresh = inputs();
    const again = [args[0], fresh('measured_free_spectrum'), fresh('measured_A_gamma')];
    stopsOnPage(() => call('effectiveAmplitudeGamma', ...again));
    expect(plain(call('effectiveAmplitudeGamma', ...again))).toEqual(reference);
  });

  it('compareAcrossBand stops on the page and then gives the command line comparison', () => {
    const reference = plain(inputs()('comparison'));
    const get = inputs();
    const args = [get('spectrum'), get('measured_free_spectrum'), get('measured_A_gamma'), get('pulsar_array')];
    stopsOnPage(() => call('compareAcrossBand', ...args));
    expect(plain(call('compareAcrossBand', ...args))).toEqual(reference);
  });

  it("eccentric harmonic tables stop on the page, per interval as it is built on first use; the cache keeps no half-built table", () => {
    const get = inputs();
    const args = [get('pop'), get('freqs'), get('e0_start'), get('f0_start')];
    const reference = plain(get('spectrum_eccentric'));
    clearHarmonicSumTables();
    stopsOnPage(() => call('eccentricEmission', args[2], args[3]));
    expect(plain(call('eccentricSpectrum', ...args))).toEqual(reference);
  });

  it('a harmonic table stopped while its log grid grows keeps a grid that gives the values of an unstopped table', () => {
    let calls = 0;
    const stopAfter = (n: number) => () => {
      if (++calls > n) throw new Error('stopped');
    };
    const xs = [80, 3e3, 1e5, 4e7];
    const plainTable = new HarmonicSumTable(0.9);
    const expected = xs.map((x) => plainTable.at(x));
    const stopped = new HarmonicSumTable(0.9, { checkTime: stopAfter(63 + 40) }); // 63 integer intervals, then 40 log points
    expect(() => stopped.at(4e7)).toThrow('stopped');
    calls = -Infinity; // no more stops
    expect(xs.map((x) => stopped.at(x))).toEqual(expected);
  });

  it('detectionSpan stops on the page, per S/N of its scan', () => {
    const get = inputs();
    const args = [get('spectrum'), get('pulsar_array'), get('snr_threshold')];
    const reference = plain(get('detection_span'));
    stopsOnPage(() => call('detectionSpan', ...args));
    expect(plain(call('detectionSpan', ...args))).toEqual(reference);
  });

  it("delayedPopulation and stalledFraction with an environment stop on the page, per lifetime solved", () => {
    const get = inputs();
    const args = [get('pop'), get('stellar_environment')];
    const reference = [plain(get('A_yr_hardened')), plain(get('stalled_share_hardened'))];
    stopsOnPage(() => call('delayedPopulation', ...args));
    setCellBudget(1e-9);
    stopsOnPage(() => call('stalledFraction', ...args));
    expect(plain(call('amplitudeAtYear', call('delayedPopulation', ...args)))).toEqual(reference[0]);
    expect(plain(call('stalledFraction', ...args))).toEqual(reference[1]);
  });

  it('built-ins applied to each element of a list (a reference mass function, lifetimes) stop on the page, per element', () => {
    const get = inputs();
    const grid = Sheet.fromFile(JSON.stringify({ format: 'strainsheet', version: 2, title: '', notes: '', cells: [{ name: 'masses', formula: 'logGrid(1e6 Msun, 1e11 Msun, 200)' }] }));
    const masses = grid.value('masses');
    const reference = call('localMassFunction', 'velocityDispersion');
    const expected = [plain(call('referencePhi', reference, masses)), plain(call('hardeningLifetime', get('stellar_environment'), masses, 0.5))];
    stopsOnPage(() => call('referencePhi', reference, masses));
    setCellBudget(1e-9);
    stopsOnPage(() => call('hardeningLifetime', get('stellar_environment'), masses, 0.5));
    expect([plain(call('referencePhi', reference, masses)), plain(call('hardeningLifetime', get('stellar_environment'), masses, 0.5))]).toEqual(expected);
  });

  it('without hand-off (the command line) a budget too short for anything does not stop these loops', () => {
    const get = inputs();
    const reference = plain(call('binariesPerBin', get('pop'), get('freqs'), get('array_span'), get('stellar_environment')));
    call('binariesPerBin', get('pop'), get('freqs'), get('array_span'));
    clearHarmonicSumTables();
    setCellBudget(1e-9);
    expect(plain(call('binariesPerBin', get('pop'), get('freqs'), get('array_span'), get('stellar_environment')))).toEqual(reference);
    expect(call('eccentricEmission', get('e0_start'), get('f0_start'))).toBeDefined();
    expect(plain(call('detectionSpan', get('spectrum'), get('pulsar_array'), get('snr_threshold')))).toEqual(plain(get('detection_span')));
  });
});
