import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { later } from "./later";

// The send after a save waits for a pause in saving, then for an idle moment; hiding the
// page sends at once. Fake timers stand in for the clock; the idle callback is the host's.
describe("later: the send after a save", () => {
  beforeEach(() => void vi.useFakeTimers());
  afterEach(() => void vi.useRealTimers());

  it("runs once, after saving has paused for the delay, however many saves came before", () => {
    const run = vi.fn();
    const l = later(run, 1_500, 1_000, {});
    l.schedule();
    vi.advanceTimersByTime(1_000);
    l.schedule(); // a second save inside the pause starts the wait again
    vi.advanceTimersByTime(1_000);
    expect(run).not.toHaveBeenCalled();
    expect(l.pending()).toBe(true);
    vi.advanceTimersByTime(500);
    expect(run).toHaveBeenCalledTimes(1);
    expect(l.pending()).toBe(false);
    vi.advanceTimersByTime(10_000);
    expect(run).toHaveBeenCalledTimes(1);
  });

  it("waits for the page's idle moment after the pause, no longer than the idle limit", () => {
    const run = vi.fn();
    const idle: { cb: () => void; timeout: number }[] = [];
    const host = {
      requestIdleCallback: (cb: () => void, opts?: { timeout: number }) => idle.push({ cb, timeout: opts!.timeout }),
      cancelIdleCallback: vi.fn(),
    };
    const l = later(run, 1_500, 1_000, host);
    l.schedule();
    vi.advanceTimersByTime(1_500);
    expect(run).not.toHaveBeenCalled();
    expect(idle).toHaveLength(1);
    expect(idle[0]!.timeout).toBe(1_000);
    idle[0]!.cb();
    expect(run).toHaveBeenCalledTimes(1);
  });

  it("sends at once when flushed (the page is hidden), and only when something waits", () => {
    const run = vi.fn();
    const l = later(run, 1_500, 1_000, {});
    l.flush();
    expect(run).not.toHaveBeenCalled();
    l.schedule();
    l.flush();
    expect(run).toHaveBeenCalledTimes(1);
    vi.advanceTimersByTime(5_000);
    expect(run).toHaveBeenCalledTimes(1); // the flushed send is not repeated by the timer
  });

  it("a cancelled send (the page went away) does not run", () => {
    const run = vi.fn();
    const l = later(run, 1_500, 1_000, {});
    l.schedule();
    l.cancel();
    vi.advanceTimersByTime(5_000);
    expect(run).not.toHaveBeenCalled();
  });
});
