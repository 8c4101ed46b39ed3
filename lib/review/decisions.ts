/** The desk's keyboard: one place, shown on screen and used by the key handler. */
export const DESK_KEYS = {
  next: "j",
  previous: "k",
  approve: "a",
  reject: "r",
  returnWithQuestion: "q",
  reidentify: "i",
  bulk: "b",
  help: "?",
} as const;
