// The `thermal` section of the input side: the motor's lumped network (winding node, stator node,
// coolant), an optional speed table of the stator-to-coolant resistance (self-ventilated motor), the
// limits, and the inverter's junction (its resistance and limit, switched together).
import { Section } from '../../components/Section';
import { num } from '../../components/format';
import type { Draft, Json } from '../../state/draft';
import { editSubtree, getAt } from '../../state/draft';
import { useFormStore, useFormValue } from '../../state/form-store';
import { NumField, RowCell, unitOf, useMessages, type Hint } from './Inputs';
import { Optional, OptionalKeys } from './OptionalPart';
import { START_BY_SPEED, START_JUNCTION, START_THERMAL } from './starting-values';

/** Specific heats, J/(kg·K): copper 385, electrical steel about 460 (from memory). */
const hints = {
  copper: ((v) => `≈ ${num(v / 385)} kg of copper`) as Hint,
  steel: ((v) => `≈ ${num(v / 460)} kg of steel`) as Hint,
  insulation: ((v) => {
    const cls = ({ 130: 'B', 155: 'F', 180: 'H', 200: 'N', 220: 'R' } as Record<number, string>)[v];
    return cls ? `insulation class ${cls}` : '';
  }) as Hint,
};

const F = (props: { path: string; label: string; hint?: Hint; optional?: boolean; placeholder?: string }) => (
  <NumField path={props.path} label={props.label} unit={unitOf(props.path)} optional={props.optional} placeholder={props.placeholder} hint={props.hint} />
);

/** Time constants and the steady rises of the network as typed, as one line (null while a term is unreadable). */
export function networkLine(tree: Json): string | null {
  const g = (k: string): number | null => {
    const v = getAt(tree, `thermal.${k}`);
    return typeof v === 'number' && v > 0 ? v : null;
  };
  const cw = g('windingCapacity_J_per_K');
  const rws = g('windingToStator_K_per_W');
  const cs = g('statorCapacity_J_per_K');
  const rsc = g('statorToCoolant_K_per_W');
  if (cw === null || rws === null || cs === null || rsc === null) return null;
  // each node's own time constant (its capacity through its resistance outward); the steady rise of
  // the winding above the coolant per kW of copper loss: both resistances in series (common practice, no source)
  return `time constants: winding ${num(cw * rws)} s, stator ${num(cs * rsc)} s; steady winding rise ${num((rws + rsc) * 1000)} K per kW of copper loss`;
}

/** The speed table of the stator-to-coolant resistance: two lists edited as rows. */
function BySpeedRows() {
  const store = useFormStore();
  const base = 'thermal.statorToCoolantBySpeed';
  const n = useFormValue((d) => {
    const a = getAt(d.tree, `${base}.speed_rpm`);
    const b = getAt(d.tree, `${base}.K_per_W`);
    return Math.max(Array.isArray(a) ? a.length : 0, Array.isArray(b) ? b.length : 0);
  });
  const msgs = [...useMessages(base), ...useMessages(`${base}.speed_rpm`), ...useMessages(`${base}.K_per_W`)];
  const list = (k: string): Json[] => {
    const x = getAt(store.getDraft().tree, `${base}.${k}`);
    return Array.isArray(x) ? x : [];
  };
  const edit = (f: (xs: Json[], k: string) => Json[]) =>
    store.update((d) => ['speed_rpm', 'K_per_W'].reduce((acc, k) => editSubtree(acc, `${base}.${k}`, f(list(k), k)), d));
  return (
    <div>
      <table className="rows" data-path={base}>
        <thead>
          <tr>
            <th>speed, rpm</th>
            <th>stator → coolant, K/W</th>
            <th />
          </tr>
        </thead>
        <tbody>
          {Array.from({ length: n }, (_, i) => (
            <tr key={i}>
              <RowCell path={`${base}.speed_rpm.${i}`} label={`speed, row ${i + 1}`} text={false} />
              <RowCell path={`${base}.K_per_W.${i}`} label={`stator to coolant, row ${i + 1}`} text={false} />
              <td>
                <button className="btn small" title="Remove this row" onClick={() => edit((xs) => xs.filter((__, j) => j !== i))}>
                  ×
                </button>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {msgs.map((m) => (
        <div key={m} className="msg" role="alert" data-msg-for={base}>{m}</div>
      ))}
      <button
        className="btn small"
        onClick={() =>
          edit((xs, k) => {
            const last = xs[xs.length - 1];
            const next: Json = typeof last === 'number' ? (k === 'speed_rpm' ? last + 1000 : last) : k === 'speed_rpm' ? 0 : 0.02;
            return [...xs, next];
          })
        }
      >
        + speed
      </button>
    </div>
  );
}

export function ThermalSection() {
  const line = useFormValue((d) => networkLine(d.tree));
  return (
    <Section title="Thermal network" testId="sec-thermal">
      <Optional path="thermal" label="Thermal rating" blank={START_THERMAL} note="winding — stator — coolant" alsoOff={dropCoolantBand}>
        <F path="thermal.coolantTemp_C" label="Coolant" />
        <F path="thermal.windingCapacity_J_per_K" label="Winding capacity" hint={hints.copper} />
        <F path="thermal.windingToStator_K_per_W" label="Winding → stator" />
        <F path="thermal.statorCapacity_J_per_K" label="Stator capacity" hint={hints.steel} />
        <F path="thermal.statorToCoolant_K_per_W" label="Stator → coolant" />
        <Optional path="thermal.statorToCoolantBySpeed" label="Self-ventilated: stator → coolant by speed" blank={START_BY_SPEED} note="replaces the value above">
          <BySpeedRows />
        </Optional>
        <F path="thermal.magnetAboveStator_K" label="Magnet above stator" optional placeholder="0" />
        <F path="thermal.windingMax_C" label="Winding max" hint={hints.insulation} />
        <F path="thermal.magnetMax_C" label="Magnet max" />
        {line && (
          <div className="hint" style={{ fontSize: 12, margin: '2px 0 4px' }} data-testid="thermal-derived">
            {line}
          </div>
        )}
        <OptionalKeys parent="thermal" keys={START_JUNCTION} testPath="thermal.junction" label="Inverter junction rated" note="one switch position">
          <F path="thermal.junctionToCoolant_K_per_W" label="Junction → coolant" />
          <F path="thermal.junctionMax_C" label="Junction max" />
        </OptionalKeys>
      </Optional>
    </Section>
  );
}

/** Without a thermal section a tolerance band on its coolant temperature names nothing: it goes too. */
function dropCoolantBand(d: Draft): Draft {
  const t = getAt(d.tree, 'tolerances');
  if (t === null || typeof t !== 'object' || Array.isArray(t) || !('thermal.coolantTemp_C' in t)) return d;
  const { ['thermal.coolantTemp_C']: _gone, ...rest } = t;
  return editSubtree(d, 'tolerances', rest);
}
