import type { PoolEvent } from '../../workers/workerPool';

/**
 * The line under the Map for news from the worker pool. `replacedSoFar` counts the workers
 * replaced in this page so far (the event's own included).
 */
export function workerNotice(event: PoolEvent, replacedSoFar: number): string {
  switch (event.kind) {
    case 'replaced':
      return replacedSoFar > 1
        ? `${replacedSoFar} map workers were replaced so far (the last one: ${event.reason}); their tasks were run again.`
        : `A map worker was replaced (${event.reason}); its tasks were run again.`;
    case 'fallback':
      return `The map workers could not start (${event.reason}): maps are computed on this page instead, more slowly.`;
    case 'unavailable':
      return `The map workers could not start (${event.reason}): the map cannot be computed.`;
  }
}
