import { expose } from 'comlink';
import { mapStagesApi } from './mapStages';

// While it lives, this worker holds a Web Lock named after it (its `name`): the page sees the
// lock released when the worker stops for any reason, even one that fires no `error` event.
void navigator.locks
  ?.request(self.name, () => new Promise<never>(() => undefined))
  .catch(() => undefined);

/** The Map worker: exposes the stage functions (all logic lives in solver/) and a ping. */
expose({ ...mapStagesApi, ping: () => true });
