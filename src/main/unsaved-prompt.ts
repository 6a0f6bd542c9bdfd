// The question main asks when the page refuses to unload (the renderer's beforeunload handler
// holds unsaved edits). Data only, so it is tested under Node; index.ts shows it with Electron.

/** Options for Electron's dialog.showMessageBoxSync. */
export interface UnsavedPrompt {
  type: 'question';
  title: string;
  message: string;
  detail: string;
  buttons: string[];
  defaultId: number;
  cancelId: number;
  noLink: true;
}

/** Button index that lets the window close. */
export const LEAVE_BUTTON = 1;

export function unsavedPrompt(documentName: string | null): UnsavedPrompt {
  const what = documentName ? `“${documentName}”` : 'This project';
  return {
    type: 'question',
    title: 'Unsaved changes',
    message: `${what} has changes that are not saved.`,
    detail: 'Closing keeps a recovery copy of the edits, offered back at the next start, but the file itself stays as it was last saved.',
    buttons: ['Keep editing', 'Close without saving'],
    defaultId: 0,
    cancelId: 0,
    noLink: true,
  };
}

/** True when the answer of the dialog lets the window close. */
export const closeAllowed = (buttonIndex: number): boolean => buttonIndex === LEAVE_BUTTON;
