/** The chargewalk command: runCli (pure) and the real bin spawned with stdin. */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../core/cli/run';

const BIN = fileURLToPath(new URL('../../bin/chargewalk.mjs', import.meta.url));
const run = (args: string[], input: string) => spawnSync(process.execPath, [BIN, ...args], { input, encoding: 'utf8', timeout: 60_000 });

describe('runCli', () => {
  it('estimate prints the response JSON and exits 0', () => {
    const r = runCli(['estimate'], JSON.stringify({ model: 'point', fieldVPerM: 1e5, distanceM: 0.03 }));
    expect(r.code).toBe(0);
    expect(r.stderr).toBe('');
    const out = JSON.parse(r.stdout);
    expect(out.chargeC).toBeCloseTo(1.0013850505816673e-8, 20);
    expect(out.interval.chargeC[0]).toBeLessThan(out.chargeC);
  });

  it('sweep prints the response JSON', () => {
    const readings = [0.02, 0.04, 0.08, 0.16].map((d) => ({ distanceM: d, fieldVPerM: 1 / d ** 2 }));
    const r = runCli(['sweep'], JSON.stringify({ readings }));
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout).exponent).toBeCloseTo(2, 9);
  });

  it('bad input: the error envelope on stderr naming the field, exit 2', () => {
    const r = runCli(['estimate'], JSON.stringify({ model: 'sphere', fieldVPerM: 1, distanceM: 0.1 }));
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(JSON.parse(r.stderr)).toEqual({
      error: { code: 'invalid', message: 'geometry.radiusM is required for the sphere model', fields: [{ path: 'geometry.radiusM', message: 'geometry.radiusM is required for the sphere model' }] },
    });
  });

  it('not JSON, unknown subcommand, no subcommand: exit 2', () => {
    expect(runCli(['estimate'], '{oops').code).toBe(2);
    expect(JSON.parse(runCli(['estimate'], '{oops').stderr).error.code).toBe('invalid');
    expect(runCli(['frobnicate'], '{}')).toMatchObject({ code: 2, stdout: '' });
    expect(runCli([], '').code).toBe(2);
    expect(runCli(['--help'], '').code).toBe(0);
  });
});

describe('bin/chargewalk.mjs (spawned with node)', () => {
  it('estimate from stdin -> stdout, exit 0', () => {
    const p = run(['estimate'], JSON.stringify({ model: 'conductor', potentialV: 10000, geometry: { capacitanceF: 200e-12 } }));
    expect(p.status).toBe(0);
    const out = JSON.parse(p.stdout);
    expect(out.chargeC).toBeCloseTo(2e-6, 15); // arithmetic: 200 pF at 10 kV -> 2 uC (NFPA 77 (2000) Table A.3.1.5 person)
    expect(out.energyJ).toBeCloseTo(0.01, 12); // and 10 mJ
  });

  it('bad input -> error envelope on stderr, exit 2', () => {
    const p = run(['estimate'], JSON.stringify({ model: 'point', fieldVPerM: 1, distanceM: 0 }));
    expect(p.status).toBe(2);
    expect(p.stdout).toBe('');
    expect(JSON.parse(p.stderr).error.fields[0].path).toBe('distanceM');
  });

  it('sweep with two readings -> exit 2 naming readings', () => {
    const p = run(['sweep'], JSON.stringify({ readings: [{ distanceM: 0.01, fieldVPerM: 1 }, { distanceM: 0.02, fieldVPerM: 0.5 }] }));
    expect(p.status).toBe(2);
    expect(JSON.parse(p.stderr).error.fields[0]).toEqual({ path: 'readings', message: 'a sweep needs at least 3 readings' });
  });

  it('unknown subcommand -> usage on stderr, exit 2', () => {
    const p = run(['nope'], '');
    expect(p.status).toBe(2);
    expect(p.stderr).toMatch(/Usage: chargewalk/);
  });
});
