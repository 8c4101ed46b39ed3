/**
 * The desk's keyboard, in one table: the key handler and the on-screen key list both read it
 * (design.md, "Review desk keys"). Each value is the KeyboardEvent.key that triggers the action;
 * `keyLabel` says how it is written on screen.
 */
export const DESK_KEYS = {
  next: "j",
  previous: "k",
  approve: "y",
  reject: "x",
  returnWithQuestion: "q",
  reidentify: "t",
  undo: "u",
  bulk: "B", // Shift+B: a capital B, so a stray lower-case key never opens the bulk confirmation
  filters: "/",
  help: "?",
  close: "Escape",
} as const;
export type DeskAction = keyof typeof DESK_KEYS;

/** The key as written on screen and in aria-keyshortcuts. */
export function keyLabel(action: DeskAction): string {
  const key = DESK_KEYS[action];
  if (key === "Escape") return "Esc";
  if (/^[A-Z]$/.test(key)) return `Shift+${key}`;
  return key;
}

/** How long the toast offers to undo a decision (the history offers it later to coordinators). */
export const TOAST_UNDO_MS = 60_000;
