import { AxisEditor } from './AxisEditor';
import { ResolutionField } from './ResolutionField';

/** The plane the Map covers: two axes and the grid. */
export function PlaneFields() {
  return (
    <fieldset className="setup-group">
      <legend>Plane</legend>
      <div className="axes">
        <AxisEditor name="x" />
        <AxisEditor name="y" />
      </div>
      <ResolutionField />
    </fieldset>
  );
}
