// The form's state outside React: each field subscribes to its own path, so a keystroke re-renders
// one field, not the whole input side.
import { createContext, useContext, useSyncExternalStore } from 'react';
import type { Draft } from './draft';

export class FormStore {
  private draft: Draft;
  private issues: Record<string, string>;
  private readonly listeners = new Set<() => void>();
  private readonly draftListeners = new Set<() => void>();

  constructor(draft: Draft, issues: Record<string, string>) {
    this.draft = draft;
    this.issues = issues;
  }

  getDraft = (): Draft => this.draft;
  getIssues = (): Record<string, string> => this.issues;

  /** An edit by the user. */
  update(f: (d: Draft) => Draft): void {
    this.draft = f(this.draft);
    this.emit();
    for (const l of this.draftListeners) l();
  }

  /** A new project (opened, demo): no edit event. */
  replace(draft: Draft, issues: Record<string, string>): void {
    this.draft = draft;
    this.issues = issues;
    this.emit();
  }

  setIssues(issues: Record<string, string>): void {
    this.issues = issues;
    this.emit();
  }

  /** For components (useSyncExternalStore). */
  subscribe = (l: () => void): (() => void) => {
    this.listeners.add(l);
    return () => this.listeners.delete(l);
  };

  /** Called after each user edit. */
  onEdit(l: () => void): () => void {
    this.draftListeners.add(l);
    return () => this.draftListeners.delete(l);
  }

  private emit(): void {
    for (const l of this.listeners) l();
  }
}

export const FormContext = createContext<FormStore | null>(null);

export const useFormStore = (): FormStore => useContext(FormContext)!;

/** A value derived from the form; must be a primitive (or otherwise stable) for the same state. */
export function useFormValue<T>(select: (d: Draft, issues: Record<string, string>) => T): T {
  const s = useFormStore();
  return useSyncExternalStore(s.subscribe, () => select(s.getDraft(), s.getIssues()));
}
