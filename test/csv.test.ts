// CSV text: RFC 4180 quoting and formula neutralisation, in the one module every CSV writer uses.
// Shafranovich (2005), RFC 4180, "Common Format and MIME Type for Comma-Separated Values (CSV)
// Files" (quoting, doubled quotes, CRLF); OWASP, "CSV Injection" (cells starting =, +, -, @, tab, CR).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { csvDocument, csvNumber, csvRow, csvText, parseCsv, readsAsFormula } from '../src/core/reports/csv';
import { computeEnvelope } from '../src/core/steady-state/envelope';
import { loadProjectText } from '../src/core/project/project';
import { runSimulation } from '../src/core/simulation/simulate';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import { envelopeCsv as cliEnvelopeCsv } from '../src/cli/commands/envelope';
import { simulationCsv } from '../src/cli/commands/simulate';
import { computeEnvelopes, type Results } from '../src/renderer/src/state/compute';
import { envelopeCsv as appEnvelopeCsv, tracesCsv } from '../src/renderer/src/components/exports';

const demo = (name: string) => readFileSync(join(__dirname, `../resources/demo-${name}.json`), 'utf8');
const HOSTILE = ['=HYPERLINK("http://x","y")', '+1+2', '-2+3', '@SUM(A1)', '\tx', '\rx', 'a,b', 'line1\nline2', 'say "hi"', 'plain'];

describe('csv cells', () => {
  it('quotes every text cell and doubles its quotes (RFC 4180 2.5-2.7)', () => {
    expect(csvText('plain')).toBe('"plain"');
    expect(csvText('a,b')).toBe('"a,b"');
    expect(csvText('say "hi"')).toBe('"say ""hi"""');
    expect(csvText('line1\nline2')).toBe('"line1\nline2"');
  });

  it('neutralises a text cell that starts a formula with a single quote (OWASP CSV injection)', () => {
    expect(csvText('=1+1')).toBe(`"'=1+1"`);
    expect(csvText('+1')).toBe(`"'+1"`);
    expect(csvText('-1')).toBe(`"'-1"`);
    expect(csvText('@x')).toBe(`"'@x"`);
    expect(csvText('\tx')).toBe(`"'\tx"`);
    expect(csvText('\rx')).toBe(`"'\rx"`);
    expect(csvText('a=1')).toBe('"a=1"');
  });

  it('keeps number cells numbers: -1.5 stays -1.5, unquoted; non-finite is empty', () => {
    expect(csvNumber(-1.5)).toBe('-1.5');
    expect(csvNumber(1 / 3)).toBe('0.3333333333');
    expect(csvNumber(Number.NaN)).toBe('');
    expect(csvRow(['x', -1.5, null, 2e-9])).toBe('"x",-1.5,,2e-9');
    expect(readsAsFormula('-1.5')).toBe(false);
    expect(readsAsFormula('-1.5e-3')).toBe(false);
    expect(readsAsFormula('-1+2')).toBe(true);
  });

  it('a document ends every record with CRLF and reads back cell for cell', () => {
    const rows = [['name', 'value'], ...HOSTILE.map((h, i) => [h, -i - 0.5])];
    const text = csvDocument(rows);
    expect(text.endsWith('\r\n')).toBe(true);
    const back = parseCsv(text);
    expect(back).toHaveLength(rows.length);
    for (let i = 0; i < rows.length; i++) {
      expect(back[i]).toHaveLength(2);
      const cell = back[i]![0]!;
      expect(readsAsFormula(cell)).toBe(false);
      // the text comes back whole, behind the neutralising quote where it needed one
      expect(cell).toBe(/^[=+\-@\t\r]/.test(rows[i]![0] as string) ? `'${rows[i]![0]}` : rows[i]![0]);
    }
    expect(back.slice(1).map((r) => Number(r[1]))).toEqual(HOSTILE.map((_, i) => -i - 0.5));
  });
});

describe('every CSV writer goes through it', () => {
  const base = JSON.parse(demo('ipm-traction')) as Record<string, unknown>;
  for (const name of HOSTILE) {
    it(`app envelope export: project name ${JSON.stringify(name)} stays one cell, not a formula`, () => {
      const rp = loadProjectText(JSON.stringify({ ...base, name }));
      const r = computeEnvelopes(rp, { points: 5, speedMax: null }) as Results;
      const rows = parseCsv(appEnvelopeCsv(r));
      expect(rows[0]).toEqual([`# torquewise envelope; project: ${name}`]);
      const header = rows.findIndex((row) => row[0] === 'curve');
      expect(header).toBe(4); // three '#' rows before it: project, points, effective limits, units
      for (const row of rows.slice(header)) expect(row).toHaveLength(10);
      for (const row of rows) for (const c of row) expect(readsAsFormula(c)).toBe(false);
    });
  }

  it('app traces export and the CLI envelope and simulate CSVs: quoted headers, plain numbers, CRLF', () => {
    const rp = loadProjectText(demo('servo-axis'));
    const cli = cliEnvelopeCsv(computeEnvelope(rp.hot, rp.peak, { points: 4 }));
    expect(cli.split('\r\n')[0]).toBe('"speed_rpm","torque_Nm","power_W","id_A","iq_A","current_A_peak","current_A_rms","voltage_V_peak_phase","region"');
    const rows = parseCsv(cli);
    expect(rows).toHaveLength(5);
    for (const r of rows.slice(1)) {
      expect(r).toHaveLength(9);
      expect(Number.isFinite(Number(r[1]))).toBe(true);
    }
    const sim = runSimulation(simulationFromProject(rp, { scenario: { duration_s: 0.01 } }), { maxPoints: 20 });
    const s = parseCsv(simulationCsv(sim));
    expect(s[0]![0]).toBe('t_s');
    expect(simulationCsv(sim).startsWith('"t_s",')).toBe(true);
    for (const r of s) expect(r).toHaveLength(s[0]!.length);
    const t = tracesCsv({ t_s: [0, 1e-3], '=cmd': [-1.5, 2] });
    expect(t).toBe(`"t_s","'=cmd"\r\n0,-1.5\r\n0.001,2\r\n`);
  });
});
