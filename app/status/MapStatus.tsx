import { useFourfold } from '../store/index';

const PHASE_TEXT = {
  idle: 'Starting the solver…',
  coarse: 'Coarse frame…',
  refining: 'Refining…',
  boundaries: 'Locating boundaries…',
  verifying: 'Checking every pixel…',
  done: 'Done',
  failed: 'Stopped',
} as const;

/**
 * One line under the Map: progress and timings, any problem with the setup or the run, and
 * news of the map workers (one replaced, or none could start).
 */
export function MapStatus() {
  const phase = useFourfold((s) => s.map.phase);
  const coarseMs = useFourfold((s) => s.map.coarseMs);
  const doneMs = useFourfold((s) => s.map.doneMs);
  const problem = useFourfold((s) => s.map.problem);
  const workers = useFourfold((s) => s.map.workers);
  const setupProblem = useFourfold((s) => s.view.setupProblem);
  const resolution = useFourfold((s) => s.map.grid?.input.plane.resolution);
  return (
    <div className="map-status" data-testid="map-status" data-phase={phase}>
      <span>
        {PHASE_TEXT[phase]}
        {resolution && ` · ${resolution[0]} × ${resolution[1]}`}
        {coarseMs !== null && ` · coarse frame ${Math.round(coarseMs)} ms`}
        {doneMs !== null && ` · complete in ${Math.round(doneMs)} ms`}
      </span>
      {setupProblem && (
        <p className="error" role="alert" data-testid="setup-problem">
          {setupProblem}
        </p>
      )}
      {problem && (
        <p className="error" role="alert" data-testid="map-problem">
          {problem}
        </p>
      )}
      {workers && (
        <p className="map-workers" role="status" data-testid="map-workers">
          {workers}
        </p>
      )}
    </div>
  );
}
