// The speed step of the datasheet's envelope tables: blank for the default round step, or rpm.
import { useState } from 'react';
import { defaultTableStep, parseTableStep } from '../../../core/steady-state/envelope-table';
import { RAD_S_TO_RPM } from '../../../core/base/units';
import { datasheetPrefs } from './image-export';

export function TableStepField({ speedMax }: { speedMax: number }) {
  const [text, setText] = useState(datasheetPrefs.tableStep_rpm === undefined ? '' : String(datasheetPrefs.tableStep_rpm));
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
          datasheetPrefs.tableStep_rpm = 'step' in r ? r.step : Number(e.target.value);
        }}
      />{' '}
      rpm{message ? <span className="fail"> {message}</span> : null}
    </label>
  );
}
