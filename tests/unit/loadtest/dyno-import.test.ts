import { describe, expect, it } from 'vitest';
import { MAX_LOADTEST_BYTES, parseDynoCsv, type DynoImportResult, type DynoRun, type LoadtestIssue } from '@/lib/loadtest';

const HEADER = 'time_s,speed_kmh,wheel_torque_nm,wheel_power_w';

function ok(r: DynoImportResult): DynoRun {
  if (r.status !== 'ok') throw new Error(`expected ok, got ${JSON.stringify(r).slice(0, 600)}`);
  return r.run;
}
function errors(r: DynoImportResult): readonly LoadtestIssue[] {
  if (r.status !== 'error') throw new Error(`expected error, got ${r.status}`);
  return r.errors;
}
const enc = (s: string) => new TextEncoder().encode(s);

describe('dyno CSV: our column names', () => {
  it('reads our names at once, case- and space-insensitively, and stores SI', () => {
    const run = ok(parseDynoCsv(' Time S , SPEED_KMH,Wheel Torque NM,wheel-power-w\n0,0,40,0\n0.5,3.6,38,100\n'));
    expect(run.count).toBe(2);
    expect(Array.from(run.speedMs)).toEqual([0, 1]); // 3.6 km/h = 1 m/s
    expect(Array.from(run.wheelTorqueNm ?? [])).toEqual([40, 38]);
    expect(Array.from(run.wheelPowerW ?? [])).toEqual([0, 100]);
    expect(Array.from(run.lines)).toEqual([2, 3]);
    expect(run.fileUnits).toBe('metric');
  });

  it('converts imperial and kW / ms columns to SI (NIST SP 811 factors)', () => {
    const run = ok(parseDynoCsv('time_ms,speed_mph,wheel_torque_lbft,wheel_power_kw\n0,10,1,0.5\n1000,20,2,1\n'));
    expect(Array.from(run.timeS)).toEqual([0, 1]);
    expect(run.speedMs[1]).toBeCloseTo(8.9408, 12);
    expect(run.wheelTorqueNm?.[0]).toBeCloseTo(1.3558179483314004, 14);
    expect(run.wheelPowerW?.[1]).toBe(1000);
    expect(run.fileUnits).toBe('imperial');
  });

  it('accepts torque only or power only', () => {
    expect(ok(parseDynoCsv('time_s,speed_ms,wheel_torque_nm\n0,1,10\n1,2,10\n')).wheelPowerW).toBeNull();
    expect(ok(parseDynoCsv('time_s,speed_ms,wheel_power_hp\n0,1,1\n1,2,1\n')).wheelTorqueNm).toBeNull();
  });
});

describe('dyno CSV: dialects', () => {
  it('auto-detects semicolons with decimal commas, strips a byte-order mark, skips # comments and blank lines, keeps file line numbers', () => {
    const text = '\uFEFF# Bench 2, invented shop\r\ntime_s;speed_kmh;wheel_power_w\r\n\r\n0,0;0,0;0\r\n# pause\r\n0,5;12,5;250,75\r\n1,0;25,2;300\r\n';
    const run = ok(parseDynoCsv(enc(text)));
    expect(run.source.delimiter).toBe(';');
    expect(run.source.decimalMark).toBe(',');
    expect(Array.from(run.timeS)).toEqual([0, 0.5, 1]);
    expect(run.speedMs[1]).toBeCloseTo(12.5 / 3.6, 14);
    expect(run.wheelPowerW?.[1]).toBe(250.75);
    expect(Array.from(run.lines)).toEqual([4, 6, 7]);
  });

  it('reads semicolon files with decimal points, tab-separated files and a trailing delimiter', () => {
    expect(ok(parseDynoCsv('time_s;speed_kmh;wheel_power_w;\n0.5;10.5;100;\n1;11;110;\n')).source.decimalMark).toBe('.');
    const tab = ok(parseDynoCsv('time_s\tspeed_kmh\twheel_power_w\n0\t1,5\t10\n1\t2,5\t20\n'));
    expect(tab.source.delimiter).toBe('\t');
    expect(tab.speedMs[1]).toBeCloseTo(2.5 / 3.6, 14);
  });

  it('reads quoted headers and fields, counting lines inside quoted fields', () => {
    const text = '"time_s","speed_kmh","wheel_power_w","note"\n0,1,10,"start"\n1,2,20,"two\nline note"\n2,3,30,"x"\n';
    const run = ok(parseDynoCsv(text, { mapping: { note: { quantity: 'ignore' } } }));
    expect(Array.from(run.lines)).toEqual([2, 3, 5]);
  });

  it('reads UTF-16 with a byte-order mark, and Windows-1252 with a warning', () => {
    const u16 = new Uint8Array([0xff, 0xfe, ...Array.from(`${HEADER}\n0,1,2,3\n1,2,3,4\n`).flatMap((c) => [c.charCodeAt(0), 0])]);
    expect(ok(parseDynoCsv(u16)).count).toBe(2);
    const latin = new Uint8Array([...enc('# r\xe9glage\n').filter((b) => b < 0x80), 0x23, 0xe9, 0x0a, ...enc(`${HEADER}\n0,1,2,3\n1,2,3,4\n`)]);
    const run = ok(parseDynoCsv(latin));
    expect(run.warnings.map((w) => w.code)).toContain('not-utf8');
  });

  it('puts out-of-order samples back in time order and drops repeated time stamps, naming the lines', () => {
    const run = ok(parseDynoCsv(`${HEADER}\n0,1,10,1\n0.2,3,10,3\n0.1,2,10,2\n0.2,9,10,9\n0.3,4,10,4\n`));
    expect(Array.from(run.timeS)).toEqual([0, 0.1, 0.2, 0.3]);
    expect(Array.from(run.speedMs).map((v) => Math.round(v * 3.6))).toEqual([1, 2, 3, 4]);
    expect(Array.from(run.lines)).toEqual([2, 4, 3, 6]);
    const late = run.warnings.find((w) => w.code === 'time-out-of-order');
    expect(late).toMatchObject({ rows: [4], rowCount: 1 });
    expect(late?.message).toMatch(/line 4\); it was put back/);
    const rep = run.warnings.find((w) => w.code === 'time-repeated');
    expect(rep).toMatchObject({ rows: [5], rowCount: 1 });
    expect(rep?.message).toMatch(/line 5.*first sample at each time was kept/);
  });

  it('keeps line numbers right across papaparse chunks, with quoted multi-line fields on the chunk edges', () => {
    const rows = [HEADER + ',note'];
    for (let i = 0; i < 40000; i++) rows.push(`${i / 100},${(i % 300) / 10},30,${i % 50}${i % 7 === 0 ? ',"a\nb"' : ',x'}`);
    rows.push('999,abc,30,1,x');
    const text = rows.join('\n');
    const physical = text.split('\n').length;
    const e = errors(parseDynoCsv(text, { mapping: { note: { quantity: 'ignore' } } }));
    expect(e[0]).toMatchObject({ code: 'not-a-number', row: physical, column: 'speed_kmh', columnNumber: 2 });
  });
});

describe('dyno CSV: refused files name what is wrong', () => {
  it('empty file', () => {
    expect(errors(parseDynoCsv(''))[0]?.code).toBe('empty-file');
    expect(errors(parseDynoCsv(new Uint8Array(0)))[0]?.code).toBe('empty-file');
    expect(errors(parseDynoCsv(' \n\r\n'))[0]?.code).toBe('empty-file');
  });

  it('only comments: no header row', () => {
    expect(errors(parseDynoCsv('# nothing\n\n# here\n'))[0]).toMatchObject({ code: 'no-header' });
  });

  it('no speed column', () => {
    const e = errors(parseDynoCsv('time_s,wheel_power_w\n0,1\n1,2\n'));
    expect(e[0]).toMatchObject({ code: 'missing-column' });
    expect(e[0]?.message).toMatch(/no speed column.*speed_kmh, speed_mph, speed_ms/);
  });

  it('no torque and no power column', () => {
    expect(errors(parseDynoCsv('time_s,speed_kmh\n0,1\n1,2\n'))[0]?.message).toMatch(/no wheel torque or wheel power column/);
  });

  it('all-zero torque, naming the column', () => {
    const e = errors(parseDynoCsv('time_s,speed_kmh,wheel_torque_nm\n0,1,0\n1,2,0.0\n2,3,0\n'));
    expect(e[0]).toMatchObject({ code: 'all-zero', column: 'wheel_torque_nm', columnNumber: 3 });
    expect(e[0]?.message).toMatch(/zero on every line/);
  });

  it('a single sample, naming its line; a header with no samples', () => {
    expect(errors(parseDynoCsv(`# one\n${HEADER}\n0,1,2,3\n`))[0]).toMatchObject({ code: 'too-few-samples', row: 3 });
    expect(errors(parseDynoCsv(`${HEADER}\n`))[0]?.message).toMatch(/header but no samples/);
    // Two lines at one instant leave one sample.
    expect(errors(parseDynoCsv(`${HEADER}\n0,1,2,3\n0,1,2,3\n`))[0]?.code).toBe('too-few-samples');
  });

  it('negative values, naming line and column', () => {
    const e = errors(parseDynoCsv(`${HEADER}\n0,1,2,3\n1,-2,2,3\n`));
    expect(e[0]).toMatchObject({ code: 'negative-value', row: 3, column: 'speed_kmh', columnNumber: 2 });
    expect(e[0]?.message).toMatch(/^Line 3, column 2 "speed_kmh": -2 is negative/);
  });

  it('non-numeric and empty values, naming line and column', () => {
    const e = errors(parseDynoCsv(`${HEADER}\n0,1,2,3\n1,fast,2,3\n2,3,,4\n3,4,0x1F,5\n4,5,1,-1\n5,x,y,1\n`));
    expect(e.map((x) => [x.code, x.row, x.columnNumber])).toEqual([
      ['not-a-number', 3, 2],
      ['missing-value', 4, 3],
      ['not-a-number', 5, 3],
      ['negative-value', 6, 4],
      ['not-a-number', 7, 2],
      ['not-a-number', 7, 3],
    ]);
    expect(e[0]?.message).toBe('Line 3, column 2 "speed_kmh": "fast" is not a number.');
  });

  it('a decimal point in a decimal-comma file', () => {
    const e = errors(parseDynoCsv('time_s;speed_kmh;wheel_power_w\n0,5;1,5;10\n1,0;1.234,5;10\n'));
    expect(e[0]).toMatchObject({ code: 'not-a-number', row: 3 });
    expect(e[0]?.message).toMatch(/decimal point, but this file uses decimal commas/);
  });

  it('mixed decimal marks in the sampled lines', () => {
    expect(errors(parseDynoCsv('time_s;speed_kmh;wheel_power_w\n0,5;1,5;10\n1.5;2.5;10\n'))[0]).toMatchObject({ code: 'mixed-decimal-marks', row: 3 });
  });

  it('an unclosed quote, naming the line it starts on', () => {
    const e = errors(parseDynoCsv(`${HEADER}\n0,1,2,3\n1,2,3,4\n2,"3,4,5\n3,4,5,6\n`));
    expect(e.find((x) => x.code === 'bad-quotes')).toMatchObject({ row: 4 });
  });

  it('old Mac line ends (CR only) read like any other', () => {
    const run = ok(parseDynoCsv(`${HEADER}\r0,1,2,3\r1,2,3,4\r`));
    expect(Array.from(run.lines)).toEqual([2, 3]);
  });

  it('a line with too few values', () => {
    expect(errors(parseDynoCsv(`${HEADER}\n0,1,2,3\n1,2\n`))[0]).toMatchObject({ code: 'wrong-field-count', row: 3 });
  });

  it('binary content, or a workbook or image instead of CSV', () => {
    expect(errors(parseDynoCsv(new Uint8Array([0x74, 0x69, 0, 0, 1, 2, 3])))[0]).toMatchObject({ code: 'not-text' });
    expect(errors(parseDynoCsv(new Uint8Array([0x50, 0x4b, 0x03, 0x04, 9, 9])))[0]?.message).toMatch(/Excel \.xlsx/);
    expect(errors(parseDynoCsv(new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a])))[0]?.message).toMatch(/PNG image/);
    expect(errors(parseDynoCsv(`${HEADER}\n\u0000\u0001\u0002`))[0]?.code).toBe('not-text');
  });

  it(`more than MAX_LOADTEST_BYTES (${MAX_LOADTEST_BYTES} bytes = 50 MiB), as bytes or as text`, () => {
    expect(MAX_LOADTEST_BYTES).toBe(50 * 1024 * 1024);
    expect(errors(parseDynoCsv(new Uint8Array(MAX_LOADTEST_BYTES + 1)))[0]?.message).toMatch(/the limit is 50 MB/);
    expect(errors(parseDynoCsv('1'.repeat(MAX_LOADTEST_BYTES + 1)))[0]?.code).toBe('too-large');
    // 17.5 M characters of three UTF-8 bytes each are over the limit although the string is shorter.
    expect(errors(parseDynoCsv('\u20ac'.repeat(Math.ceil(MAX_LOADTEST_BYTES / 3) + 1)))[0]?.code).toBe('too-large');
  });

  it('two columns with the same name', () => {
    expect(errors(parseDynoCsv('time_s,speed_kmh,Speed_KMH,wheel_power_w\n0,1,1,1\n'))[0]).toMatchObject({ code: 'duplicate-header', columnNumber: 3 });
  });

  it('stops listing after 20 errors and counts the rest', () => {
    const rows = [HEADER, ...Array.from({ length: 30 }, (_, i) => `${i},${i % 2 ? 'x' : 1},${i % 2 ? 1 : 'y'},1`)];
    const e = errors(parseDynoCsv(rows.join('\n')));
    expect(e).toHaveLength(21);
    expect(e.slice(0, 20).map((x) => x.row)).toEqual(Array.from({ length: 20 }, (_, i) => i + 2)); // in line order across columns
    expect(e[20]).toMatchObject({ code: 'more-errors', message: '…and 10 more problems of the same kinds.' });
  });
});
