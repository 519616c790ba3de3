import { describe, expect, test } from 'vitest';
import { frameLimiter } from '../app/map/frameLimiter';

/** A fake animation-frame clock: `tick()` runs the callbacks registered before it. */
function fakeFrames() {
  let pending: { id: number; callback: () => void }[] = [];
  let next = 1;
  return {
    request: (callback: () => void) => {
      pending.push({ id: next, callback });
      return next++;
    },
    cancel: (id: number) => {
      pending = pending.filter((p) => p.id !== id);
    },
    tick: () => {
      const due = pending;
      pending = [];
      for (const p of due) p.callback();
    },
    get waiting() {
      return pending.length;
    },
  };
}

describe('frameLimiter', () => {
  test('the first request runs at once; more in the same frame run once at the next frame', () => {
    const frames = fakeFrames();
    let runs = 0;
    const limiter = frameLimiter(() => runs++, frames.request, frames.cancel);
    limiter.request();
    expect(runs).toBe(1);
    limiter.request();
    limiter.request();
    limiter.request();
    expect(runs).toBe(1);
    frames.tick();
    expect(runs).toBe(2);
    // That run was in the new frame: the next request waits for the one after.
    limiter.request();
    expect(runs).toBe(2);
    frames.tick();
    expect(runs).toBe(3);
    // A frame without requests: the limiter goes quiet and the next request runs at once.
    frames.tick();
    expect(frames.waiting).toBe(0);
    limiter.request();
    expect(runs).toBe(4);
  });

  test('cancel drops a pending run and leaves nothing scheduled', () => {
    const frames = fakeFrames();
    let runs = 0;
    const limiter = frameLimiter(() => runs++, frames.request, frames.cancel);
    limiter.request();
    limiter.request();
    limiter.cancel();
    expect(frames.waiting).toBe(0);
    frames.tick();
    expect(runs).toBe(1);
    limiter.request();
    expect(runs).toBe(2);
  });
});
