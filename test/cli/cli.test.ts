// The real command line (node bin/strainsheet.mjs) on small engine test sheets in test/fixtures.
// Expected numbers are hand arithmetic on the fixture's invented inputs: 70 km/s/Mpc * 250 Mpc =
// 17500 km/s; 1 / 12.5 yr = 1e9 / (12.5 * 31557600) nHz = 2.535 nHz (Julian year, IAU).
import { describe, expect, it } from 'vitest';
import { execFile } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { main } from '../../src/cli/main';

const root = fileURLToPath(new URL('../..', import.meta.url));
const fixture = (name: string) => join(root, 'test', 'fixtures', name);

function run(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(process.execPath, [join(root, 'bin', 'strainsheet.mjs'), ...args], { cwd: root, timeout: 60_000 }, (error, stdout, stderr) => {
      const code = error ? (typeof (error as { code?: unknown }).code === 'number' ? ((error as { code: number }).code) : -1) : 0;
      resolve({ code, stdout, stderr });
    });
  });
}

describe('strainsheet evaluate', () => {
  it('prints a table of name, value and unit and exits 0', async () => {
    const r = await run(['evaluate', fixture('smallSheet.json')]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const lines = r.stdout.trim().split('\n').map((l) => l.split(/\s{2,}/));
    expect(lines[0]).toEqual(['name', 'value', 'unit']);
    const row = (name: string) => lines.find((l) => l[0] === name);
    expect(row('v_rec')).toEqual(['v_rec', '17500', 'km/s']);
    expect(row('f_low')).toEqual(['f_low', String(Number((1e9 / (12.5 * 31557600)).toPrecision(4))), 'nHz']);
    expect(row('power')).toEqual(['power', 'power(x, k)']);
  }, 180_000);

  it('--json gives values in SI, display text and null errors', async () => {
    const r = await run(['evaluate', fixture('smallSheet.json'), '--json']);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout) as { cells: Array<Record<string, unknown>> };
    const cell = (name: string) => out.cells.find((c) => c.name === name)!;
    expect(Object.keys(cell('v_rec'))).toEqual(['name', 'value', 'unit', 'text', 'error']);
    expect(cell('v_rec')).toEqual({ name: 'v_rec', value: { value: 17_500_000, unit: 'm s^-1' }, unit: 'km/s', text: '17500 km/s', error: null });
    expect(cell('cube_of_two').value).toBe(8);
    expect((cell('freqs').value as unknown[]).length).toBe(5);
  }, 180_000);

  it('--set replaces formulas, adds cells and function cells', async () => {
    const r = await run(['evaluate', fixture('smallSheet.json'), '--json', '--set', 'D_src=500 Mpc', '--set', 'sq(x) = x^2 + 1', '--set=extra=sq(3)']);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout) as { cells: Array<{ name: string; value: unknown }> };
    const value = (name: string) => out.cells.find((c) => c.name === name)!.value;
    expect(value('v_rec')).toEqual({ value: 35_000_000, unit: 'm s^-1' }); // 70 * 500 km/s
    expect(value('extra')).toBe(10);
  }, 180_000);

  it('exits 1 and lists each failed cell on stderr as name: message', async () => {
    const r = await run(['evaluate', fixture('sheetWithErrors.json')]);
    expect(r.code).toBe(1);
    const lines = r.stderr.trim().split('\n');
    expect(lines).toHaveLength(2);
    expect(lines[0]).toBe('mixed: cannot add 10 yr and 3 Mpc: their units have different dimensions');
    expect(lines[1]).toMatch(/^after: input mixed has an error/);
    expect(r.stdout).toMatch(/fine\s+42/);
  }, 180_000);

  it('exits 2 for a truncated file, with a readable message', async () => {
    const r = await run(['evaluate', fixture('truncatedSheet.json')]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/not valid JSON \(it may be truncated/);
    expect(r.stdout).toBe('');
  }, 180_000);

  it('prints help and exits 0', async () => {
    const help = await run(['--help']);
    expect(help.code).toBe(0);
    expect(help.stdout).toMatch(/evaluate\s+evaluate a sheet file/);
  }, 180_000);
});

// The same entry point in-process (main from src/cli/main.ts), for the many refusal cases:
// spawning a process per case would only repeat the start-up.
describe('main() refusals', () => {
  async function call(argv: string[]) {
    let stdout = '';
    let stderr = '';
    const code = await main(argv, { out: (t) => void (stdout += t), err: (t) => void (stderr += t) });
    return { code, stdout, stderr };
  }

  it('exits 2 for missing, hostile, newer and directory files', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'strainsheet-cli-'));
    const hostile = join(dir, 'hostile.json');
    writeFileSync(hostile, '{"format":"strainsheet","version":1,"cells":[],"__proto__":{"x":1}}');
    const newer = join(dir, 'newer.json');
    writeFileSync(newer, '{"format":"strainsheet","version":9,"cells":[]}');
    const cases: Array<[string, RegExp]> = [
      [join(dir, 'absent.json'), /cannot read .*no such file/],
      [hostile, /__proto__/],
      [newer, /made by a newer Strainsheet/],
      [dir, /directory/],
    ];
    for (const [file, message] of cases) {
      const r = await call(['evaluate', file]);
      expect(r.code, file).toBe(2);
      expect(r.stderr, file).toMatch(message);
      expect(r.stdout).toBe('');
    }
  });

  it('exits 2 for a bad command line', async () => {
    expect((await call(['evaluate'])).code).toBe(2);
    expect((await call([])).code).toBe(2);
    const unknownOption = await call(['evaluate', fixture('smallSheet.json'), '--colour']);
    expect(unknownOption.code).toBe(2);
    expect(unknownOption.stderr).toMatch(/unknown option --colour/);
    const badName = await call(['evaluate', fixture('smallSheet.json'), '--set', 'pi=3']);
    expect(badName.code).toBe(2);
    expect(badName.stderr).toMatch(/pi cannot be a cell name/);
    expect((await call(['evaluate', fixture('smallSheet.json'), '--set', 'novalue'])).stderr).toMatch(/--set needs name=formula/);
    expect((await call(['frobnicate'])).code).toBe(2);
    const evHelp = await call(['evaluate', '--help']);
    expect(evHelp.code).toBe(0);
    expect(evHelp.stdout).toMatch(/--set name=formula/);
  });

  // issue 10: what the app opens, the command line opens; a bad cell never silences the table
  it('reads files with a byte-order mark or in UTF-16 and refuses malformed UTF-8 with the offset', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'strainsheet-cli-'));
    const text = JSON.stringify({ format: 'strainsheet', version: 1, cells: [{ name: 'a', formula: '6 * 7' }] });
    const le = Buffer.from('\ufeff' + text, 'utf16le');
    const files: Array<[string, Buffer]> = [
      ['bom.json', Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(text)])],
      ['utf16le.json', le],
    ];
    for (const [name, bytes] of files) {
      writeFileSync(join(dir, name), bytes);
      const r = await call(['evaluate', join(dir, name)]);
      expect(r.code, name).toBe(0);
      expect(r.stdout, name).toMatch(/a\s+42/);
    }
    const bad = Buffer.from(text.replace('6 * 7', '6 * 7 \u00ff'));
    const at = bad.indexOf(0xc3);
    bad[at] = 0xff; // not a UTF-8 byte anywhere
    writeFileSync(join(dir, 'bad.json'), bad);
    const r = await call(['evaluate', join(dir, 'bad.json')]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(new RegExp(`not valid UTF-8 text: the bytes at offset ${at} \\(ff`));
  });

  it('prints every cell and names the failures for values the display cannot show', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'strainsheet-cli-'));
    const file = join(dir, 'odd.json');
    const cells = [
      { name: 'cosmo', formula: 'flatCosmology(70 km/s/Mpc, 0.3)' },
      { name: 'listed', formula: '[cosmo]' },
      { name: 'root', formula: 'sqrt(-4 m^2)' },
      { name: 'fine', formula: '42' },
    ];
    writeFileSync(file, JSON.stringify({ format: 'strainsheet', version: 1, cells }));
    const r = await call(['evaluate', file]);
    expect(r.code).toBe(1);
    expect(r.stdout).toMatch(/fine\s+42/);
    expect(r.stdout).toMatch(/listed\s+error \(eval\)/);
    expect(r.stderr).toMatch(/^listed: .*cosmology/m);
    expect(r.stderr).toMatch(/^root: the result is a complex quantity/m);
  });

  it('takes --cell-budget and --run-budget, and names the budget in the limit error', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'strainsheet-cli-'));
    const file = join(dir, 'slow.json');
    const cells = [
      { name: 'step', formula: 'step(x) = x + 1' },
      { name: 'slow', formula: 'sum(map(1:1e6, step))' },
    ];
    writeFileSync(file, JSON.stringify({ format: 'strainsheet', version: 1, cells }));
    const r = await call(['evaluate', file, '--cell-budget', '0.05']);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/^slow: the evaluation ran longer than its time budget of 0\.05 s per cell/m);
    const run = await call(['evaluate', '--run-budget=0.001', file]);
    expect(run.code).toBe(1);
    expect(run.stderr).toMatch(/the run's time budget of 0\.001 s is used up/);
    for (const bad of [['--cell-budget', 'soon'], ['--run-budget', '-1'], ['--cell-budget']]) {
      const b = await call(['evaluate', file, ...bad]);
      expect(b.code, bad.join(' ')).toBe(2);
      expect(b.stderr).toMatch(/must be a positive number of seconds|needs a number of seconds/);
    }
  });
});
