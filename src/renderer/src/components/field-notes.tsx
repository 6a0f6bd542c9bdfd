// Findings beside the inputs they concern, and one strip of them above every view. A finding's field
// path names its input; the strip's entries jump to it.
import { createContext, useContext, useState, type ReactNode } from 'react';
import type { Finding } from '../../../core/base/finding';
import { fieldPhrase, plainMessage, severityPhrase } from '../../../core/reports/phrases';
import { normalisePath } from '../state/draft';
import { jumpToField } from './jump-to-field';

export type NotesByPath = Readonly<Record<string, Finding[]>>;
export const FieldNotesContext = createContext<NotesByPath>({});

/** Findings keyed by the path of the input that shows them (a section-level path also keys its .value field). */
export function notesByPath(findings: Finding[]): NotesByPath {
  const out: Record<string, Finding[]> = {};
  for (const f of findings) {
    if (!f.field) continue;
    const p = normalisePath(f.field);
    (out[p] ??= []).push(f);
    (out[`${p}.value`] ??= []).push(f);
  }
  return out;
}

/** A stable key of a findings list: the context value changes only when the findings do. */
export const findingsKey = (fs: Finding[]): string => fs.map((f) => `${f.severity}|${f.field ?? ''}|${f.code}|${f.message}`).join('\n');

export function FieldNotes({ path }: { path: string }) {
  const notes = useContext(FieldNotesContext)[path];
  if (!notes?.length) return null;
  return (
    <>
      {notes.map((f) => (
        <span key={f.code + f.message} className={`note ${f.severity}`} data-note-for={path} data-code={f.code}>
          {severityPhrase(f.severity)}: {plainMessage(f.message)}
        </span>
      ))}
    </>
  );
}

/** The findings about the inputs, above every view: one line each, the input's name a link to it. */
export function FindingsStrip({ findings }: { findings: Finding[] }) {
  const [open, setOpen] = useState(false);
  if (findings.length === 0) return null;
  const order = { danger: 0, warning: 1, info: 2 } as const;
  const sorted = [...findings].sort((a, b) => order[a.severity] - order[b.severity]);
  const worst = sorted[0]!.severity;
  const shown = open ? sorted : sorted.slice(0, 2);
  const counts = (['danger', 'warning', 'info'] as const)
    .map((s) => [s, sorted.filter((f) => f.severity === s).length] as const)
    .filter(([, n]) => n > 0)
    .map(([s, n]) => `${n} ${severityPhrase(s)}${n > 1 ? (s === 'info' ? 's' : 's') : ''}`)
    .join(', ');
  return (
    <div className={`findings-strip ${worst}`} data-testid="findings-strip" role="note" aria-label="Findings about the inputs">
      <div className="strip-head">
        <strong>Inputs: {counts}</strong>
        {sorted.length > 2 && (
          <button className="btn small" data-testid="findings-more" onClick={() => setOpen(!open)}>
            {open ? 'show fewer' : `show all ${sorted.length}`}
          </button>
        )}
      </div>
      {shown.map((f) => (
        <StripLine key={f.code + (f.field ?? '') + f.message} f={f} />
      ))}
    </div>
  );
}

function StripLine({ f }: { f: Finding }): ReactNode {
  return (
    <div className={`strip-line ${f.severity}`} data-code={f.code}>
      <span className="sev">{severityPhrase(f.severity)}</span>
      {f.field && (
        <button className="link" title="Go to this input" data-jump={normalisePath(f.field)} onClick={() => jumpToField(f.field!)}>
          {fieldPhrase(normalisePath(f.field))}
        </button>
      )}
      <span className="text">{plainMessage(f.message)}</span>
    </div>
  );
}
