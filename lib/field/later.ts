// Work that may wait a moment: the send after a save (issue 18). A save is done when its
// IndexedDB transaction has completed; the send starts once saving has paused for `delayMs`
// and the page is idle (requestIdleCallback, at most `idleMs` more), so a volunteer saving
// several sightings in a row is never held up by the sender's own transactions. `flush` runs
// what waits at once (the page is being hidden or closed: the service worker's Background
// Sync takes over from there, and the next opening of the field log sends anything left).

type IdleWindow = {
  requestIdleCallback?: (cb: () => void, opts?: { timeout: number }) => number;
  cancelIdleCallback?: (id: number) => void;
};

export type Later = { schedule(): void; flush(): void; cancel(): void; pending(): boolean };

export function later(run: () => void, delayMs: number, idleMs: number, host: IdleWindow = globalThis): Later {
  let timer: ReturnType<typeof setTimeout> | undefined;
  let idle: number | undefined;
  const clear = () => {
    if (timer !== undefined) clearTimeout(timer);
    if (idle !== undefined) host.cancelIdleCallback?.(idle);
    timer = undefined;
    idle = undefined;
  };
  const fire = () => {
    clear();
    run();
  };
  return {
    schedule() {
      clear();
      timer = setTimeout(() => {
        timer = undefined;
        if (host.requestIdleCallback) idle = host.requestIdleCallback(fire, { timeout: idleMs });
        else fire();
      }, delayMs);
    },
    flush() {
      if (timer !== undefined || idle !== undefined) fire();
    },
    cancel: clear,
    pending: () => timer !== undefined || idle !== undefined,
  };
}
