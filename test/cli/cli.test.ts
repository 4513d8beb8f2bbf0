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
});
