import { expose } from 'comlink';
import { mapStagesApi } from './mapStages';

/** The Map worker: only exposes the stage functions (all logic lives in solver/). */
expose(mapStagesApi);
