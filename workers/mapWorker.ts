import { expose } from 'comlink';
import { mapStagesApi } from './mapStages';

/**
 * While it lives, this worker holds a Web Lock named after it (its `name`): the page sees the
 * lock released when the worker stops for any reason, even one that fires no `error` event.
 * True once the lock is held; false where Web Locks are missing.
 */
const lifeLock = new Promise<boolean>((holds) => {
  if (!navigator.locks) return holds(false);
  navigator.locks
    .request(self.name, () => {
      holds(true);
      return new Promise<never>(() => undefined);
    })
    .catch(() => holds(false));
});

/** The Map worker: exposes the stage functions (all logic lives in solver/) and its liveness. */
expose({ ...mapStagesApi, ping: () => true, lifeLock: () => lifeLock });
