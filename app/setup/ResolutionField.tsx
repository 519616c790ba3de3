import { groupThousands } from '../format';
import { APP_MAX_RESOLUTION, resolutionProblem } from '../scenario/setupCheck';
import { useFourfold } from '../store/index';
import { commitSetup } from './commitSetup';
import type { EntryRule } from './numberEntry';
import { NumberField } from './NumberField';

export const RESOLUTION_PRESETS = [64, 128, 256, 512] as const;

const SIDE_RULE: EntryRule = {
  min: 2,
  max: APP_MAX_RESOLUTION,
  integer: true,
  tooSmall: resolutionProblem(1)!,
  tooLarge: resolutionProblem(APP_MAX_RESOLUTION + 1)!,
};

function commitSide(k: 0 | 1, side: number): string | null {
  return commitSetup((s) => {
    const resolution: [number, number] = [s.resolution[0], s.resolution[1]];
    resolution[k] = side;
    return { resolution };
  });
}

/** Grid points per side of the Map: square presets, or nx and ny typed. */
export function ResolutionField() {
  const nx = useFourfold((s) => s.setup.resolution[0]);
  const ny = useFourfold((s) => s.setup.resolution[1]);
  return (
    <div className="resolution" role="group" aria-labelledby="plane-resolution-label">
      <span id="plane-resolution-label" className="field-name">
        Resolution
      </span>
      <div className="presets">
        {RESOLUTION_PRESETS.map((side) => (
          <button
            key={side}
            type="button"
            aria-pressed={nx === side && ny === side}
            data-testid={`resolution-${side}`}
            onClick={() => commitSetup({ resolution: [side, side] })}
          >
            {side}
          </button>
        ))}
      </div>
      <div className="axis-row">
        <NumberField
          id="plane-nx"
          name="resolution nx"
          label={
            <>
              <var>n</var>
              <sub>x</sub>
            </>
          }
          value={nx}
          rule={SIDE_RULE}
          testId="resolution-nx"
          onCommit={(side) => commitSide(0, side)}
        />
        <NumberField
          id="plane-ny"
          name="resolution ny"
          label={
            <>
              <var>n</var>
              <sub>y</sub>
            </>
          }
          value={ny}
          rule={SIDE_RULE}
          testId="resolution-ny"
          onCommit={(side) => commitSide(1, side)}
        />
        <span className="setup-hint">{groupThousands(nx * ny)} states</span>
      </div>
    </div>
  );
}
