import { describe, expect, it } from 'vitest';
import { closeAllowed, LEAVE_BUTTON, unsavedPrompt } from '../src/main/unsaved-prompt';

describe('unsaved-changes question on close', () => {
  it('names the document, defaults to keep editing, and closes only on the explicit button', () => {
    const p = unsavedPrompt('rig-7.json');
    expect(p.message).toBe('“rig-7.json” has changes that are not saved.');
    expect(p.buttons[p.defaultId]).toBe('Keep editing');
    expect(p.cancelId).toBe(p.defaultId); // Escape or closing the dialog keeps the edits
    expect(p.buttons[LEAVE_BUTTON]).toBe('Close without saving');
    expect(closeAllowed(p.defaultId)).toBe(false);
    expect(closeAllowed(LEAVE_BUTTON)).toBe(true);
    expect(unsavedPrompt(null).message).toBe('This project has changes that are not saved.');
  });
});
