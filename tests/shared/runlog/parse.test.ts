import convert from 'convert-units';
import { describe, expect, it } from 'vitest';
import { parseRunlog, type ParseResult } from '../../../shared/runlog/parse';
import { proposeMapping, runMappingSchema, splitHeader } from '../../../shared/runlog/mapping';

function ok(result: ParseResult) {
  if (!result.ok) throw new Error(`expected a run, got ${JSON.stringify(result.problem)}`);
  return result.run;
}
function problem(result: ParseResult) {
  if (result.ok) throw new Error('expected a problem, got a run');
  return { status: result.status, ...result.problem };
}
const codes = (result: ParseResult) => ok(result).notes.map((n) => n.code);

const OURS = ['time_s,throttle_pct,motor_rpm,current_a,pack_v', '0,0,0,0.5,8.4', '0.1,50,12000,20,8.1', '0.2,100,24000,40,7.9'].join('\n');

describe('parseRunlog: our vocabulary', () => {
  it('reads our own header with no mapping and no notes about mapping', () => {
    const run = ok(parseRunlog(OURS));
    expect(Array.from(run.time)).toEqual([0, 0.1, 0.2]);
    expect(Array.from(run.channels.motor_rpm!)).toEqual([0, 12000, 24000]);
    expect(codes(parseRunlog(OURS))).toEqual([]);
  });

  it('removes a byte-order mark and reads CRLF line ends (RFC 4180 uses CRLF)', () => {
    const run = parseRunlog('\ufeff' + OURS.replace(/\n/g, '\r\n') + '\r\n');
    expect(Array.from(ok(run).time)).toEqual([0, 0.1, 0.2]);
    expect(codes(run)).toContain('bom_removed');
  });

  it('reads quoted fields (RFC 4180 §2: fields may be enclosed in double quotes)', () => {
    const run = ok(parseRunlog('"time_s","current_a"\n"0","1.5"\n"0.5","2.5"\n'));
    expect(Array.from(run.channels.current_a!)).toEqual([1.5, 2.5]);
  });
});

describe('parseRunlog: files from elsewhere', () => {
  it('detects semicolons and decimal commas before the comma guess', () => {
    const text = 'Zeit [s];Strom [A];Spannung [V]\n0,00;1,5;8,40\n0,10;12,25;8,10\n0,20;30,0;7,95\n';
    const run = parseRunlog(text);
    expect(Array.from(ok(run).channels.current_a!)).toEqual([1.5, 12.25, 30]);
    expect(Array.from(ok(run).channels.pack_v!)).toEqual([8.4, 8.1, 7.95]);
    expect(codes(run)).toEqual(expect.arrayContaining(['delimiter', 'decimal_comma']));
  });

  it('converts ms, °F, mA and mV the way convert-units does', () => {
    const text = 'Time (ms),Motor Temp (°F),Current (mA),Pack (mV)\n0,212,1500,8400\n2500,160,25000,7600\n';
    const run = ok(parseRunlog(text));
    expect(run.time[1]).toBeCloseTo(convert(2500).from('ms').to('s'), 12); // convert-units oracle: 2500 ms = 2.5 s
    expect(run.channels.motor_temp_c![0]).toBeCloseTo(convert(212).from('F').to('C'), 9); // convert-units oracle: 212 °F = 100 °C
    expect(run.channels.motor_temp_c![1]).toBeCloseTo(convert(160).from('F').to('C'), 9); // convert-units oracle
    expect(run.channels.current_a![0]).toBeCloseTo(convert(1500).from('mA').to('A'), 12); // convert-units oracle: 1.5 A
    expect(run.channels.pack_v![1]).toBeCloseTo(convert(7600).from('mV').to('V'), 12); // convert-units oracle: 7.6 V
  });

  it('turns electrical rpm into motor rpm by pole pairs', () => {
    const mapping = runMappingSchema.parse({ time_s: { column: 't', unit: 's' }, motor_rpm: { column: 'erpm', unit: 'erpm', poles: 4 } });
    const run = ok(parseRunlog('t,erpm\n0,0\n1,60000\n', mapping));
    // Electrical rpm = mechanical rpm × pole pairs (Ohio University basic EE notes, ch. 14, §14.3: n = 120 f / P): 60,000 erpm on 4 poles = 30,000 rpm.
    expect(run.channels.motor_rpm![1]).toBe(30000);
  });

  it('drops a duplicated row and says which', () => {
    const run = parseRunlog('time_s,current_a\n0,1\n0.1,2\n0.1,2\n0.2,3\n');
    expect(Array.from(ok(run).time)).toEqual([0, 0.1, 0.2]);
    expect(ok(run).notes.find((n) => n.code === 'duplicates_dropped')?.rows).toEqual([4]);
  });

  it('sorts timestamps that are out of order and lists the rows', () => {
    const run = parseRunlog('time_s,current_a\n0,1\n0.1,2\n0.3,4\n0.2,3\n0.4,5\n');
    expect(Array.from(ok(run).time)).toEqual([0, 0.1, 0.2, 0.3, 0.4]);
    expect(Array.from(ok(run).channels.current_a!)).toEqual([1, 2, 3, 4, 5]);
    expect(ok(run).notes.find((n) => n.code === 'sorted')?.rows?.length).toBeGreaterThan(0);
  });

  it('flags a gap', () => {
    const run = ok(parseRunlog('time_s,current_a\n0,1\n0.1,1\n0.2,1\n0.3,1\n5.3,1\n5.4,1\n'));
    expect(run.gaps).toEqual([{ fromS: 0.3, toS: 5.3 }]);
    expect(run.notes.map((n) => n.code)).toContain('gaps');
  });

  it('bridges a time counter that starts again (a 16-bit millisecond counter wrapping)', () => {
    const rows = [65300, 65400, 65500, 64, 164, 264, 364].map((ms, i) => `${ms},${i}`);
    const run = parseRunlog(`time_ms,current_a\n${rows.join('\n')}\n`);
    const t = Array.from(ok(run).time);
    expect(t.every((v, i) => i === 0 || v > t[i - 1])).toBe(true);
    expect(t[3] - t[2]).toBeCloseTo(0.1, 9);
    expect(ok(run).notes.find((n) => n.code === 'counter_reset')?.rows).toEqual([5]);
  });

  it('says so when the proposed mapping was used', () => {
    expect(codes(parseRunlog('Time [s],Throttle [%]\n0,0\n1,100\n'))).toContain('mapping_proposed');
  });
});

describe('parseRunlog: refusals name the row and column', () => {
  const cases: Array<[string, string, string, number, string | undefined]> = [
    ['a word in a number cell', 'time_s,current_a\n0,1\n0.1,lots\n', 'not_a_number', 3, 'current_a'],
    ['NaN', 'time_s,current_a\n0,1\n0.1,NaN\n', 'not_finite', 3, 'current_a'],
    ['Infinity', 'time_s,current_a\n0,1\n0.1,-Infinity\n', 'not_finite', 3, 'current_a'],
    ['a spreadsheet formula', 'time_s,current_a\n0,1\n0.1,=SUM(A1:A2)\n', 'formula', 3, 'current_a'],
    ['a formula starting with +', 'time_s,current_a\n0,1\n0.1,+cmd|x\n', 'formula', 3, 'current_a'],
    ['negative time', 'time_s,current_a\n0,1\n-0.1,1\n', 'negative_time', 3, 'time_s'],
    ['a repeated time with other readings', 'time_s,current_a\n0,1\n0.1,2\n0.1,3\n', 'repeated_time', 4, 'time_s'],
    ['no time column', 'volts,amps\n1,2\n3,4\n', 'no_time_column', 1, undefined],
    ['no header', '0,1\n0.1,2\n', 'no_header', 1, undefined],
    ['binary data', 'PK\u0003\u0004\u0000\u0000garbage', 'not_a_run_log', 1, undefined],
    ['an empty time cell', 'time_s,current_a\n0,1\n,2\n', 'missing_time', 3, 'time_s'],
  ];
  for (const [label, text, code, row, column] of cases) {
    it(label, () => {
      expect(problem(parseRunlog(text))).toMatchObject({ status: 400, code, row, ...(column ? { column } : {}) });
    });
  }

  it('refuses a mapping to a column the file does not have', () => {
    const mapping = runMappingSchema.parse({ time_s: { column: 'Zeit', unit: 's' } });
    expect(problem(parseRunlog('t,x\n0,1\n1,2\n', mapping))).toMatchObject({ code: 'unknown_column', row: 1, column: 'Zeit' });
  });

  it('refuses an unknown unit in a mapping', () => {
    const result = runMappingSchema.safeParse({ time_s: { column: 't', unit: 'fortnights' } });
    expect(result.success).toBe(false);
    expect(result.error!.issues[0].path).toEqual(['time_s', 'unit']);
  });

  it('stops reading past the row limit with 413', () => {
    const rows = Array.from({ length: 60 }, (_v, i) => `${i},1`).join('\n');
    expect(problem(parseRunlog(`time_s,current_a\n${rows}\n`, undefined, { maxRows: 50 }))).toMatchObject({ status: 413, code: 'too_many_rows' });
  });
});

describe('proposeMapping', () => {
  it('reads units in brackets or parentheses', () => {
    expect(splitHeader('Current (mA)')).toEqual({ words: 'current', unit: 'mA' });
    expect(splitHeader('Motor Temp [°F]')).toEqual({ words: 'motor temp', unit: '°F' });
  });

  it('maps a typical foreign header', () => {
    const { mapping, unmatched } = proposeMapping([
      'Time [ms]',
      'Throttle (%)',
      'eRPM',
      'Motor Temp (F)',
      'ESC Temp (C)',
      'Current [mA]',
      'Battery (V)',
      'GPS',
    ]);
    expect(mapping).toEqual({
      time_s: { column: 'Time [ms]', unit: 'ms' },
      throttle_pct: { column: 'Throttle (%)', unit: '%' },
      motor_rpm: { column: 'eRPM', unit: 'erpm' },
      motor_temp_c: { column: 'Motor Temp (F)', unit: 'F' },
      esc_temp_c: { column: 'ESC Temp (C)', unit: 'C' },
      current_a: { column: 'Current [mA]', unit: 'mA' },
      pack_v: { column: 'Battery (V)', unit: 'V' },
    });
    expect(unmatched).toEqual(['GPS']);
  });
});
