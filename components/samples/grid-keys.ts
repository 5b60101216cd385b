/**
 * Spreadsheet keys for the results grid. Editable controls carry data-cell="<column>", a row's
 * other controls (select box, evidence, Replace, Attach, Save) data-row-action and tabIndex -1, so
 * Tab walks only the editable cells. Enter saves the row and moves down to the same column;
 * ↑/↓ in a text cell move up and down; ←/→ at the edge of a cell reach the row's other controls.
 */
const ROW = "tr[data-item-id]";
const STOPS = "[data-cell]:not(:disabled), [data-row-action]:not(:disabled)";

function rowOf(el: HTMLElement) {
  return el.closest<HTMLTableRowElement>(ROW);
}

/** Focuses the same column `step` rows away (skipping rows where it is not editable); false at the edge. */
export function focusVertical(from: HTMLElement, step: 1 | -1): boolean {
  const column = from.dataset.cell;
  let row = rowOf(from);
  if (!column || !row) return false;
  for (;;) {
    let next: Element | null = step === 1 ? row.nextElementSibling : row.previousElementSibling;
    while (next && !next.matches(ROW)) next = step === 1 ? next.nextElementSibling : next.previousElementSibling;
    if (!next) return false;
    row = next as HTMLTableRowElement;
    const target = row.querySelector<HTMLElement>(`[data-cell="${column}"]:not(:disabled)`);
    if (target) {
      target.focus();
      if (target instanceof HTMLInputElement) target.select();
      return true;
    }
  }
}

function focusAcross(from: HTMLElement, step: 1 | -1): boolean {
  const row = rowOf(from);
  if (!row) return false;
  const stops = Array.from(row.querySelectorAll<HTMLElement>(STOPS));
  const target = stops[stops.indexOf(from) + step];
  if (!target) return false;
  target.focus();
  return true;
}

const caretAt = (el: HTMLElement, edge: "start" | "end") => {
  if (!(el instanceof HTMLInputElement) || el.type === "checkbox" || el.type === "file") return true;
  const { selectionStart: s, selectionEnd: e, value } = el;
  return s === e && (edge === "start" ? s === 0 : e === value.length);
};

export function onGridKeyDown(e: React.KeyboardEvent<HTMLElement>) {
  const el = e.target as HTMLElement;
  if (!el.matches(STOPS) || e.altKey || e.ctrlKey || e.metaKey) return;
  const isSelect = el instanceof HTMLSelectElement;
  const isText = el instanceof HTMLInputElement && el.type !== "checkbox";
  if (e.key === "Enter" && el.dataset.cell && !e.shiftKey) {
    e.preventDefault();
    (el as HTMLInputElement | HTMLSelectElement).form?.requestSubmit();
    focusVertical(el, 1);
  } else if ((e.key === "ArrowDown" || e.key === "ArrowUp") && isText && el.dataset.cell) {
    if (focusVertical(el, e.key === "ArrowDown" ? 1 : -1)) e.preventDefault();
  } else if ((e.key === "ArrowRight" || e.key === "ArrowLeft") && !isSelect) {
    const step = e.key === "ArrowRight" ? 1 : -1;
    if (caretAt(el, step === 1 ? "end" : "start") && focusAcross(el, step)) e.preventDefault();
  }
}
