// Text from a file reaches the terminal as data: no printed name or label can add a line, end one
// early or reorder what is shown (newline, U+2028/U+2029, bidirectional controls are escaped).
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { main } from '../src/cli/index';
import { terminalJson, terminalText, visible } from '../src/cli/terminal';
import { DEMOS } from '../trust/fuzz-cases';

/** Every character a terminal must not receive raw from a file. */
const RAW = /[\u0000-\u0009\u000b-\u001f\u007f-\u009f\u061c\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/;
const HOSTILE = 'M\nfake: all requirements met\r\u2028x\u2029y\u202eevil\u202c\u2066iso\u2069\u200f\u001b[2J\u0085\t';

describe('visible', () => {
  it('escapes newline, tab, CR, ESC, C1, U+2028/U+2029 and every bidirectional control; keeps other text', () => {
    expect(visible(HOSTILE)).toBe('M\\u000afake: all requirements met\\u000d\\u2028x\\u2029y\\u202eevil\\u202c\\u2066iso\\u2069\\u200f\\u001b[2J\\u0085\\u0009');
    for (const c of ['\u202a', '\u202b', '\u202c', '\u202d', '\u202e', '\u2066', '\u2067', '\u2068', '\u2069', '\u061c', '\u200e']) expect(visible(c)).toMatch(/^\\u[0-9a-f]{4}$/);
    expect(visible('N·m at 20 °C, 16 µs, Ω, 日本')).toBe('N·m at 20 °C, 16 µs, Ω, 日本');
    expect(visible(visible(HOSTILE))).toBe(visible(HOSTILE)); // idempotent
  });

  it('terminalText: one printed line per entry, whatever an entry holds', () => {
    const t = terminalText(['a', `name ${HOSTILE}`, '']);
    expect(t.split('\n')).toHaveLength(4);
    expect(t).not.toMatch(RAW);
  });

  it('terminalJson: the same document when parsed, with no raw separator or bidirectional control', () => {
    const doc = { name: HOSTILE, list: ['\u2028', '\u202e'] };
    const s = terminalJson(doc);
    expect(s).not.toMatch(RAW);
    expect(JSON.parse(s)).toEqual(doc);
  });
});

describe('every command prints names and labels from the file escaped', () => {
  const dir = mkdtempSync(join(tmpdir(), 'tw-cli-term-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  const j = structuredClone(DEMOS['demo-servo-axis']) as Record<string, any>;
  j.name = HOSTILE;
  j.requirements = j.requirements.map((q: Record<string, unknown>) => ({ ...q, label: `${q.label}\nfake\u202e` }));
  j.scenario.duration_s = 0.06; // short, past the load step at 50 ms
  const f = join(dir, 'hostile.json');
  writeFileSync(f, JSON.stringify(j));

  const commands: string[][] = [['params'], ['envelope', '--points', '8'], ['point', '--speed', '1000', '--torque', '1'], ['size'], ['simulate'], ['tune']];
  for (const [cmd, ...opts] of commands) {
    it(`${cmd}: no raw control or bidirectional character, no line starting with the injected text; --json parses back to the name`, async () => {
      let out = '';
      let err = '';
      const code = await main([cmd!, f, ...opts], { write: (s: string) => (out += s) }, { write: (s: string) => (err += s) });
      expect(err).toBe('');
      expect(code).toBe(0);
      expect(out).toContain('M\\u000afake: all requirements met');
      expect(out).not.toMatch(RAW);
      expect(out.split('\n').some((l) => /^fake/.test(l))).toBe(false);
      let json = '';
      expect(await main([cmd!, f, ...opts, '--json'], { write: (s: string) => (json += s) }, { write: () => true })).toBe(0);
      expect(json).not.toMatch(RAW);
      if (cmd === 'params') expect(JSON.parse(json).name).toBe(HOSTILE);
    });
  }

  it('a refusal naming a key from the file stays one line', async () => {
    const k = join(dir, 'key.json');
    writeFileSync(k, JSON.stringify({ ...DEMOS['demo-spm-48v'] as object, ['bad\nfake line\u2028\u202e']: 1 }));
    let err = '';
    expect(await main(['params', k], { write: () => true }, { write: (s: string) => (err += s) })).toBe(2);
    expect(err.split('\n')).toHaveLength(2); // one line and its newline
    expect(err).not.toMatch(RAW);
  });
});
