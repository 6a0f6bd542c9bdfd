// Jump to an input on the side panel: scroll it into view and focus it (the one place each input is
// edited). A path given at section level (nameplate.Kt) finds its value field (nameplate.Kt.value);
// a field not shown (an optional input left out) falls back to the nearest shown parent's first input.
import { normalisePath } from '../state/draft';

export function findInput(path: string, root: ParentNode = document): HTMLElement | null {
  const p = normalisePath(path);
  // inputs only (a list's table carries its path too, but cannot take the focus)
  const F = ':is(input, select)';
  const q = (x: string) => root.querySelector<HTMLElement>(`.inputs ${F}[data-path="${CSS.escape(x)}"]`);
  const under = (x: string) => root.querySelector<HTMLElement>(`.inputs ${F}[data-path^="${CSS.escape(x)}."]`);
  const hit = q(p) ?? q(`${p}.value`) ?? q(`${p}:present`) ?? under(p);
  if (hit) return hit;
  const parts = p.split('.');
  for (let i = parts.length - 1; i > 0; i--) {
    const parent = parts.slice(0, i).join('.');
    const h = q(`${parent}:present`) ?? under(parent);
    if (h) return h;
  }
  // a section left out: its "+ add" button
  const sec = SECTION[parts[0]!] ?? parts[0]!;
  return root.querySelector<HTMLElement>(`.inputs [data-testid="sec-${CSS.escape(sec)}"] input, .inputs [data-testid="sec-${CSS.escape(sec)}"] select, .inputs [data-testid="sec-${CSS.escape(sec)}"] button`);
}

const SECTION: Record<string, string> = { nameplate: 'motor', motor: 'motor', conditions: 'temps', requirements: 'requirements', control: 'control', scenario: 'scenario', inverter: 'inverter' };

/** Scroll the side panel to the input of `path` and focus it; returns false when no input shows it. */
export function jumpToField(path: string): boolean {
  const el = findInput(path);
  if (!el) return false;
  el.scrollIntoView({ block: 'center' });
  el.focus({ preventScroll: true });
  el.classList.add('jumped');
  setTimeout(() => el.classList.remove('jumped'), 1200);
  return true;
}
