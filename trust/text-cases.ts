/**
 * Text from a file through every CSV writer and into the plot-text escaper (`npm run trust`).
 *  - CSV: a project name (and a trace channel name) mutated into hostile text goes through the
 *    app's envelope and traces exports and the CLI's envelope and simulate CSVs; every record must
 *    read back (RFC 4180) with the header's number of cells, no cell may read as a spreadsheet
 *    formula (OWASP CSV injection: =, +, -, @, tab, CR), and the name must come back whole.
 *  - Plots: hostile labels through plotText must reach plotly as plain text: no tag survives, no
 *    %{...} placeholder, and plotly's entity decoding gives back the label as written.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { parseCsv, readsAsFormula } from '../src/core/reports/csv';
import { computeEnvelope } from '../src/core/steady-state/envelope';
import { loadProjectText } from '../src/core/project/project';
import { runSimulation } from '../src/core/simulation/simulate';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import { envelopeCsv as cliEnvelopeCsv } from '../src/cli/commands/envelope';
import { simulationCsv } from '../src/cli/commands/simulate';
import { computeEnvelopes, type Results } from '../src/renderer/src/state/compute';
import { envelopeCsv as appEnvelopeCsv, tracesCsv } from '../src/renderer/src/components/exports';
import { plotText } from '../src/renderer/src/components/plot-text';

const root = join(import.meta.dirname ?? __dirname, '..');

/** Fixed hostile texts, then random ones built from the characters that matter. */
export const HOSTILE_TEXTS = [
  '=HYPERLINK("http://example.invalid","x")', '+cmd|" /C calc"!A0', '-2+3+cmd|" /C calc"!A0', '@SUM(1+1)*cmd|" /C calc"!A0',
  '\t=1', '\r=1', 'a,b', 'line1\nline2', 'line1\r\nline2', 'say "hi"', '"', '""', ',', '\n', "'", '',
  '<a href="x">A</a><br>', '<span style="color:red">x</span>', '<b>b</b><i>i</i><sup>2</sup><sub>d</sub><em>e</em>',
  '%{x}', '%{y:.2f}%{text}', '&lt;a&gt;', '&amp;&#60;&#x3c;', '<br/>', '<a href="javascript:alert(1)">', '</a>', '<', '>',
  '\u202eevil\u202c', '\u2028', 'normal label',
];
const PIECES = ['=', '+', '-', '@', '\t', '\r', '\n', ',', '"', "'", '<', '>', '&', '%{', '}', '<br>', '<a href="x">', '</a>', '&lt;', '&#37;', 'a', '1', ' ', 'é', '\u2028'];
const hostile = fc.array(fc.constantFrom(...PIECES), { minLength: 1, maxLength: 12 }).map((a) => a.join(''));

export function hostileTexts(seed: number, n: number): string[] {
  const extra = Math.max(0, n - HOSTILE_TEXTS.length);
  return [...HOSTILE_TEXTS.slice(0, n), ...fc.sample(hostile, { seed, numRuns: extra })];
}

export interface TextCaseTally {
  run: number;
  passed: number;
  failures: string[];
}

/** One CSV text: every record has `cols` cells (or 1 for a '#' note line), and no cell reads as a formula. */
function csvProblem(what: string, text: string, cols: number): string | null {
  const rows = parseCsv(text);
  if (rows.length === 0) return `${what}: no records`;
  for (let i = 0; i < rows.length; i++) {
    const r = rows[i]!;
    const note = r.length === 1 && r[0]!.startsWith('# ');
    if (!note && r.length !== cols) return `${what}: record ${i + 1} has ${r.length} cells, not ${cols}`;
    for (const c of r) if (readsAsFormula(c)) return `${what}: record ${i + 1} has a cell that reads as a formula: ${JSON.stringify(c.slice(0, 40))}`;
  }
  return null;
}

/** Mutated names through every CSV writer of the app and the CLI. */
export function runCsvTextCases(seed: number, n: number): TextCaseTally {
  const rp = loadProjectText(readFileSync(join(root, 'resources', 'demo-servo-axis.json'), 'utf8'));
  const results = computeEnvelopes(rp, { points: 8, speedMax: null }) as Results;
  const sim = runSimulation(simulationFromProject(rp, { scenario: { duration_s: 0.005 } }), { maxPoints: 16 });
  const tally: TextCaseTally = { run: 0, passed: 0, failures: [] };
  // the CLI's writers take no text from the file; checked once per run all the same
  const cliOnce = csvProblem('cli envelope', cliEnvelopeCsv(computeEnvelope(rp.hot, rp.peak, { points: 8 })), 9) ?? csvProblem('cli simulate', simulationCsv(sim), parseCsv(simulationCsv(sim))[0]!.length);
  for (const name of hostileTexts(seed, n)) {
    tally.run++;
    let why: string | null = cliOnce;
    try {
      const app = appEnvelopeCsv({ ...results, project: { ...results.project, name } });
      why ??= csvProblem('app envelope', app, 10);
      const first = parseCsv(app)[0];
      if (!why && (first?.length !== 1 || first[0] !== `# torquewise envelope; project: ${name || 'unnamed'}`)) why = 'app envelope: the project name did not come back whole in one cell';
      const traces = tracesCsv({ t_s: [0, 1e-4], [name || 'x']: [-1.5, 2] });
      why ??= csvProblem('app traces', traces, 2);
      const head = parseCsv(traces)[0];
      // as written, behind the neutralising quote when it starts like a formula
      const channel = name || 'x';
      if (!why && head?.[1] !== (/^[=+\-@\t\r]/.test(channel) ? `'${channel}` : channel)) why = 'app traces: the channel name did not come back whole';
    } catch (e) {
      why = `threw: ${e instanceof Error ? e.message : String(e)}`;
    }
    if (why) tally.failures.push(`${JSON.stringify(name.slice(0, 40))}: ${why}`);
    else tally.passed++;
  }
  return tally;
}

// what plotly does with a text string: tags are found first, then entities are decoded in the
// text between them (read from plotly.js-dist-min 4.1.2, its svg text utilities)
const PLOTLY_TAG = /(<[^<>]*>)/;
const PLOTLY_TAG_NAMES = /^<\/?(br|b|i|em|sup|sub|span|a|s|u)\b/i;
const NAMED: Record<string, string> = { lt: '<', gt: '>', amp: '&', nbsp: '\u00a0', mu: 'μ', times: '×', plusmn: '±', deg: '°' };
export function plotlyReads(s: string): { tags: string[]; text: string } {
  const tags: string[] = [];
  let text = '';
  for (const part of s.split(PLOTLY_TAG)) {
    if (PLOTLY_TAG.test(part) && PLOTLY_TAG_NAMES.test(part)) tags.push(part);
    else text += part.replace(/&(#\d+|#x[\da-fA-F]+|[a-z]+);/g, (m, e: string) => (e[0] === '#' ? String.fromCodePoint(e[1] === 'x' ? parseInt(e.slice(2), 16) : parseInt(e.slice(1), 10)) : NAMED[e] ?? m));
  }
  return { tags, text };
}

/** Hostile labels through the plot-text escaper. */
export function runPlotTextCases(seed: number, n: number): TextCaseTally {
  const tally: TextCaseTally = { run: 0, passed: 0, failures: [] };
  for (const label of hostileTexts(seed + 1, n)) {
    tally.run++;
    const e = plotText(label);
    const read = plotlyReads(e);
    let why: string | null = null;
    if (/[<>]/.test(e)) why = 'an angle bracket reached plotly';
    else if (e.includes('%{')) why = 'a %{...} placeholder reached a hover template';
    else if (read.tags.length) why = `plotly would read tags ${read.tags.join(' ')}`;
    else if (read.text !== label) why = `plotly would show ${JSON.stringify(read.text.slice(0, 40))}`;
    if (why) tally.failures.push(`${JSON.stringify(label.slice(0, 40))}: ${why}`);
    else tally.passed++;
  }
  return tally;
}
