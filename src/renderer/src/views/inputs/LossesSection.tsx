// The `losses` section of the input side: iron (Steinmetz-type, in the flux-linkage amplitude and
// the electrical frequency), windage, and the inverter's switches and diodes; each part switched on
// and off on its own (an absent part: that loss is zero), the fields from the schema's keys.
import { Section } from '../../components/Section';
import { num } from '../../components/format';
import type { Json } from '../../state/draft';
import { getAt } from '../../state/draft';
import { useFormValue } from '../../state/form-store';
import { HINTS, NumField, unitOf, type Hint } from './Inputs';
import { Optional } from './OptionalPart';
import { START_INVERTER_LOSSES, START_IRON, START_WINDAGE } from './starting-values';

const W_10K_RPM = (10000 * 2 * Math.PI) / 60;
const hints = {
  mJ: ((v) => `= ${num(v * 1e3)} mJ`) as Hint,
  kHz: ((v) => `= ${num(v / 1e3)} kHz`) as Hint,
  windage: ((v) => `= ${num(v * W_10K_RPM ** 3)} W at 10 000 rpm`) as Hint,
};

const F = (props: { path: string; label: string; hint?: Hint; placeholder?: string; unit?: string }) => (
  <NumField path={props.path} label={props.label} unit={props.unit ?? unitOf(props.path)} optional placeholder={props.placeholder ?? '0'} hint={props.hint} />
);

/** The iron loss at one frequency and flux linkage, from the draft's coefficients (null if unreadable). */
function ironAt(tree: Json, f: number, psi: number): number | null {
  const g = (k: string, dflt: number) => {
    const v = getAt(tree, `losses.iron.${k}`);
    return v === undefined ? dflt : v;
  };
  const kh = g('kh', 0);
  const beta = g('beta', 2);
  const ke = g('ke', 0);
  if (typeof kh !== 'number' || typeof beta !== 'number' || typeof ke !== 'number') return null;
  return kh * f * psi ** beta + ke * f * f * psi * psi;
}

function IronExample({ psi }: { psi: number | null }) {
  const line = useFormValue((d) => {
    if (psi === null) return null;
    const a = ironAt(d.tree, 100, psi);
    const b = ironAt(d.tree, 500, psi);
    return a === null || b === null ? null : `at ψm = ${num(psi * 1e3)} mWb: ${num(a)} W at 100 Hz, ${num(b)} W at 500 Hz (electrical)`;
  });
  return line ? <div className="hint" style={{ fontSize: 12, margin: '2px 0 4px' }} data-testid="iron-example">{line}</div> : null;
}

export function LossesSection({ psiM }: { psiM: number | null }) {
  return (
    <Section title="Losses" testId="sec-losses">
      <div className="hint" style={{ fontSize: 12, margin: '0 0 4px' }}>
        Copper loss follows Rs at the winding temperature, friction is in the motor terms. A part left out is a loss of zero.
      </div>
      <Optional path="losses.iron" parent="losses" label="Iron loss" blank={START_IRON} note="P = kh·f·ψ^β + ke·f²·ψ², f electrical in Hz, ψ in Wb">
        <F path="losses.iron.kh" label="Hysteresis kh" unit="W·s/Wbᵝ" />
        <F path="losses.iron.beta" label="Exponent β" placeholder="2" />
        <F path="losses.iron.ke" label="Eddy current ke" unit="W·s²/Wb²" />
        <IronExample psi={psiM} />
      </Optional>
      <Optional path="losses.windage" parent="losses" label="Windage" blank={START_WINDAGE} note="P = kw·ω³">
        <F path="losses.windage.kw" label="Windage kw" hint={hints.windage} />
      </Optional>
      <Optional path="losses.inverter" parent="losses" label="Inverter device losses" blank={START_INVERTER_LOSSES} note="per switch and diode, six of each">
        <F path="losses.inverter.Vce0" label="Switch threshold Vce0" />
        <F path="losses.inverter.rce" label="Switch slope rce" hint={HINTS.mOhm} />
        <F path="losses.inverter.Vf0" label="Diode threshold Vf0" />
        <F path="losses.inverter.rd" label="Diode slope rd" hint={HINTS.mOhm} />
        <F path="losses.inverter.EonEoff_J" label="Eon + Eoff" hint={hints.mJ} />
        <F path="losses.inverter.Err_J" label="Recovery Err" hint={hints.mJ} />
        <F path="losses.inverter.Vref_V" label="  measured at" placeholder="" />
        <F path="losses.inverter.Iref_A" label="  and" placeholder="" hint={HINTS.rmsOfPeak} />
        <F path="losses.inverter.fsw_Hz" label="Switching freq." placeholder="" hint={hints.kHz} />
      </Optional>
    </Section>
  );
}
