import { describe, expect, it } from 'vitest';
import { guessColumn, headerSignature, KNOWN_COLUMNS, parseBatteryCsv, parseDynoCsv, type ColumnMapping } from '@/lib/loadtest';

const FOREIGN = 'Elapsed (s),Roller speed [km/h],Wheel torque [N·m],Motor temp [°C]\n0,0,40,30\n0.5,3.6,38,31\n';

describe('needs mapping', () => {
  it('lists the headers with our best guesses and a proposed mapping when a header is not ours', () => {
    const r = parseDynoCsv(FOREIGN);
    expect(r.status).toBe('needs-mapping');
    if (r.status !== 'needs-mapping') return;
    expect(r.headers).toEqual(['Elapsed (s)', 'Roller speed [km/h]', 'Wheel torque [N·m]', 'Motor temp [°C]']);
    expect(r.guesses.map((g) => g.guess)).toEqual([
      { quantity: 'time', unit: 's' },
      { quantity: 'speed', unit: 'kmh' },
      { quantity: 'wheelTorque', unit: 'nm' },
      null,
    ]);
    expect(r.guesses[0]?.confidence).toBe('likely');
    expect(r.missing).toEqual(['time', 'speed']);
    expect(r.missingOneOf).toEqual(['wheelTorque', 'wheelPower']);
    expect(r.signature).toBe(headerSignature(r.headers));
    expect(r.proposedMapping['Motor temp [°C]']).toEqual({ quantity: 'ignore' });
  });

  it('applies a mapping supplied by the dealer', () => {
    const first = parseDynoCsv(FOREIGN);
    if (first.status !== 'needs-mapping') throw new Error('expected needs-mapping');
    const r = parseDynoCsv(FOREIGN, { mapping: first.proposedMapping });
    expect(r.status).toBe('ok');
    if (r.status !== 'ok') return;
    expect(Array.from(r.run.speedMs)).toEqual([0, 1]);
    expect(r.run.source.columns.map((c) => c.quantity)).toEqual(['time', 'speed', 'wheelTorque']);
  });

  it('matches mapping keys case- and space-insensitively and ignores unmapped unknown columns with a warning', () => {
    const mapping: ColumnMapping = {
      'elapsed (s)': { quantity: 'time', unit: 's' },
      'ROLLER SPEED [KM/H]': { quantity: 'speed', unit: 'kmh' },
      'Wheel torque [N·m]': { quantity: 'wheelTorque', unit: 'nm' },
    };
    const r = parseDynoCsv(FOREIGN, { mapping });
    expect(r.status === 'ok' && r.run.warnings.map((w) => [w.code, w.columnNumber])).toEqual([['column-ignored', 4]]);
  });

  it('refuses a mapping naming a column not in the file, an unknown unit, or two columns for one quantity', () => {
    const bad1 = parseDynoCsv(FOREIGN, { mapping: { Speed: { quantity: 'speed', unit: 'kmh' } } });
    expect(bad1.status === 'error' && bad1.errors[0]).toMatchObject({ code: 'mapping-unknown-column', column: 'Speed' });
    const bad2 = parseDynoCsv(FOREIGN, { mapping: { 'Roller speed [km/h]': { quantity: 'speed', unit: 'knots' } } as unknown as ColumnMapping });
    expect(bad2.status === 'error' && bad2.errors[0]).toMatchObject({ code: 'mapping-invalid', columnNumber: 2 });
    const bad3 = parseDynoCsv(FOREIGN, {
      mapping: { 'Elapsed (s)': { quantity: 'time', unit: 's' }, 'Roller speed [km/h]': { quantity: 'speed', unit: 'kmh' }, 'Motor temp [°C]': { quantity: 'speed', unit: 'kmh' } },
    });
    expect(bad3.status === 'error' && bad3.errors[0]?.message).toMatch(/both hold speed; keep one/);
  });

  it('a mapping that leaves out a required quantity is an error, not another mapping round', () => {
    const r = parseDynoCsv(FOREIGN, { mapping: { 'Elapsed (s)': { quantity: 'time', unit: 's' }, 'Wheel torque [N·m]': { quantity: 'wheelTorque', unit: 'nm' } } });
    expect(r.status === 'error' && r.errors.map((e) => e.message)).toEqual([expect.stringMatching(/no speed column/)]);
  });

  it('a battery column in a dyno file is left out with a warning', () => {
    const r = parseDynoCsv('time_s,speed_kmh,wheel_power_w,voltage_v\n0,1,2,40\n1,2,3,39\n');
    expect(r.status === 'ok' && r.run.warnings[0]).toMatchObject({ code: 'column-ignored', columnNumber: 4 });
  });

  it('every recognised name maps to its quantity and unit', () => {
    expect(KNOWN_COLUMNS['wheel_torque_lbft']).toEqual({ quantity: 'wheelTorque', unit: 'lbft' });
    expect(Object.keys(KNOWN_COLUMNS)).toHaveLength(4 + 3 + 3 + 2 + 2 + 2);
    const b = parseBatteryCsv('time_h,voltage_mv,current_ma\n0,40000,7000\n1,36000,7000\n');
    expect(b.status === 'ok' && Array.from(b.run.voltageV)).toEqual([40, 36]);
  });
});

describe('guesses', () => {
  const cases: Array<[string, unknown]> = [
    ['Time [ms]', { quantity: 'time', unit: 'ms' }],
    ['Speed (mph)', { quantity: 'speed', unit: 'mph' }],
    ['Geschwindigkeit km/h', { quantity: 'speed', unit: 'kmh' }],
    ['Torque lb-ft', { quantity: 'wheelTorque', unit: 'lbft' }],
    ['Leistung [kW]', { quantity: 'wheelPower', unit: 'kw' }],
    ['P [W]', { quantity: 'wheelPower', unit: 'w' }],
    ['Battery voltage [V]', { quantity: 'voltage', unit: 'v' }],
    ['I (A)', { quantity: 'current', unit: 'a' }],
    ['km/h', { quantity: 'speed', unit: 'kmh' }],
    ['Power', { quantity: 'wheelPower', unit: null }],
    ['Cadence', null],
    ['V', null],
  ];
  for (const [header, guess] of cases) {
    it(`"${header}" → ${JSON.stringify(guess)}`, () => {
      expect(guessColumn(header, 1).guess).toEqual(guess);
    });
  }
});

describe('headerSignature', () => {
  it('is the same for the same set of headers in any order, case or spacing, ignoring empty headers', () => {
    expect(headerSignature(['Time (s)', 'Speed', ''])).toBe(headerSignature(['speed ', ' time  (S)']));
  });
  it('differs for a different set', () => {
    expect(headerSignature(['Time (s)', 'Speed'])).not.toBe(headerSignature(['Time (s)', 'Speed', 'Power']));
    expect(headerSignature(['ab', 'c'])).not.toBe(headerSignature(['a', 'bc']));
  });
  it('is stable across releases: a fixed header set keeps its fixed key', () => {
    // FNV-1a 64 (offset 0xcbf29ce484222325, prime 0x100000001b3) of "speed\u001ftime", computed
    // independently with Python's integers; a change here would orphan every mapping dealers have saved.
    expect(headerSignature(['time', 'speed'])).toBe('hs1-22903ba9b904d86c');
  });
});
