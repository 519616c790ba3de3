/** Schedules a callback for the next animation frame; returns a handle for `cancel`. */
export type RequestFrame = (callback: () => void) => number;

export interface FrameLimiter {
  /**
   * Runs the work now if it has not run since the last animation frame began, otherwise once at
   * the start of the next frame (however often it is asked for meanwhile).
   */
  request(): void;
  /** Drops a pending run (on unmount). */
  cancel(): void;
}

/**
 * At most one run of `work` per animation frame, without waiting a frame when none has run: a
 * request made while the page prepares a frame (a store update in an animation-frame callback)
 * is drawn in that same frame.
 */
export function frameLimiter(
  work: () => void,
  requestFrame: RequestFrame = (callback) => requestAnimationFrame(callback),
  cancelFrame: (handle: number) => void = (handle) => cancelAnimationFrame(handle),
): FrameLimiter {
  let handle = 0;
  let ranThisFrame = false;
  let wanted = false;
  const settle = () => {
    handle = 0;
    ranThisFrame = false;
    if (wanted) run();
  };
  const run = () => {
    wanted = false;
    ranThisFrame = true;
    if (handle === 0) handle = requestFrame(settle);
    work();
  };
  return {
    request() {
      if (ranThisFrame) wanted = true;
      else run();
    },
    cancel() {
      if (handle !== 0) cancelFrame(handle);
      handle = 0;
      ranThisFrame = false;
      wanted = false;
    },
  };
}
