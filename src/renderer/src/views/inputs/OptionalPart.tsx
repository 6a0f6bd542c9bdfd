// An optional part of a section: a switch that writes the part with starting values or deletes it
// (one edit each way, through the form store), and the part's fields while it is there.
import type { ReactNode } from 'react';
import type { Draft, Json, Path } from '../../state/draft';
import { editSubtree, getAt } from '../../state/draft';
import { useFormStore, useFormValue } from '../../state/form-store';

const isEmptyObject = (x: Json | undefined): boolean => x !== null && typeof x === 'object' && !Array.isArray(x) && Object.keys(x).length === 0;

/** Delete `parent` when it is an empty object (the last part of a section switched off). */
function dropEmpty(d: Draft, parent: Path | undefined): Draft {
  return parent !== undefined && isEmptyObject(getAt(d.tree, parent)) ? editSubtree(d, parent, undefined) : d;
}

interface PartProps {
  /** the part's path in the project file */
  path: Path;
  label: string;
  /** what the part starts with when switched on (a function: read from the project as it is) */
  blank: Json | ((tree: Json) => Json);
  /** a section that is deleted with its last part */
  parent?: Path;
  /** a note beside the switch */
  note?: ReactNode;
  /** what else goes with the part when it is switched off (e.g. a tolerance band on one of its values) */
  alsoOff?: (d: Draft) => Draft;
  children: ReactNode;
}

function Switch(props: { present: boolean; testPath: string; label: string; note?: ReactNode; onChange: (on: boolean) => void }) {
  return (
    <label className="label" style={{ fontSize: 12, display: 'block', margin: '4px 0' }}>
      <input type="checkbox" checked={props.present} data-path={props.testPath + ':present'} onChange={(e) => props.onChange(e.target.checked)} /> {props.label}
      {props.note && <span className="hint" style={{ marginLeft: 6, color: 'var(--muted)' }}>{props.note}</span>}
    </label>
  );
}

/** A part that is one subtree of the file (e.g. `losses.inverter`). */
export function Optional(props: PartProps) {
  const store = useFormStore();
  const present = useFormValue((d) => getAt(d.tree, props.path) !== undefined);
  return (
    <div className="optional" data-part={props.path}>
      <Switch
        present={present}
        testPath={props.path}
        label={props.label}
        note={props.note}
        onChange={(on) =>
          store.update((d) => {
            const blank = typeof props.blank === 'function' ? props.blank(d.tree) : props.blank;
            if (on) return editSubtree(d, props.path, blank);
            const off = dropEmpty(editSubtree(d, props.path, undefined), props.parent);
            return props.alsoOff ? props.alsoOff(off) : off;
          })
        }
      />
      {present && <div style={{ paddingLeft: 10, borderLeft: '2px solid var(--line)', marginBottom: 6 }}>{props.children}</div>}
    </div>
  );
}

/**
 * A part that is a few keys of a section, switched together (e.g. the junction's resistance and
 * limit in `thermal`): present when any of them is, written or deleted in one edit.
 */
export function OptionalKeys(props: { parent: Path; keys: Record<string, Json>; label: string; testPath: string; note?: ReactNode; children: ReactNode }) {
  const store = useFormStore();
  const names = Object.keys(props.keys);
  const present = useFormValue((d) => names.some((k) => getAt(d.tree, `${props.parent}.${k}`) !== undefined));
  return (
    <div className="optional" data-part={props.testPath}>
      <Switch
        present={present}
        testPath={props.testPath}
        label={props.label}
        note={props.note}
        onChange={(on) =>
          store.update((d) => names.reduce((acc, k) => editSubtree(acc, `${props.parent}.${k}`, on ? props.keys[k] : undefined), d))
        }
      />
      {present && <div style={{ paddingLeft: 10, borderLeft: '2px solid var(--line)', marginBottom: 6 }}>{props.children}</div>}
    </div>
  );
}
