// The speed step of the datasheet's envelope tables: blank for the default round step, or rpm.
import { useState } from 'react';
import { defaultTableStep, parseTableStep } from '../../../core/steady-state/envelope-table';
import { RAD_S_TO_RPM } from '../../../core/base/units';

/** `step`: the step the app keeps (rpm; undefined: the default), `onStep` sets it. */
export function TableStepField({ speedMax, step, onStep }: { speedMax: number; step: number | undefined; onStep: (step_rpm: number | undefined) => void }) {
  const [text, setText] = useState(step === undefined ? '' : String(step));
  const top = speedMax * RAD_S_TO_RPM;
  const parsed = parseTableStep(text, top);
  const message = 'message' in parsed ? parsed.message : null;
  return (
    <label className="hint" title="speed step of the datasheet's envelope tables (hot and cold)">
      table step{' '}
      <input
        data-testid="table-step"
        style={{ width: 70 }}
        value={text}
        placeholder={String(defaultTableStep(top))}
        aria-invalid={message !== null}
        onChange={(e) => {
          setText(e.target.value);
          const r = parseTableStep(e.target.value, top);
          // a bad step is kept as typed: the export then refuses it with the same message
          onStep('step' in r ? r.step : Number(e.target.value));
        }}
      />{' '}
      rpm{message ? <span className="fail"> {message}</span> : null}
    </label>
  );
}
