import type { StepName } from '../history/setupHistory';
import { commitSetup } from '../setup/commitSetup';
import { useFourfold } from '../store/index';
import {
  withExtent,
  zoomAbout,
  ZOOM_STEP,
  type PlaneExtent,
  type PlotFraction,
} from './planeExtent';
import { previousExtentStep } from './previousExtent';
import { shownExtent } from './shownExtent';
import { extentName } from '../history/describeChange';

const CENTRE: PlotFraction = { fx: 0.5, fy: 0.5 };

/**
 * Makes `extent` the plane's: a plane change through the Setup's own validated path (so the
 * link, the autosave, the undo history and the Map follow), named `name` in the history. A
 * preview on screen ends. An extent the Setup refuses (too narrow to resolve) is reported in the
 * notice line and the plane stays.
 */
export function commitExtent(extent: PlaneExtent, name: StepName): string | null {
  const problem = commitSetup((s) => withExtent(s, extent), name);
  const { setPreview, setNotice } = useFourfold.getState();
  setPreview(null);
  if (problem !== null) setNotice({ kind: 'error', text: `Cannot show that extent: ${problem}.` });
  return problem;
}

/** Zooms the shown extent about a point of the plot (the centre by default). */
export function zoomMap(factor: number, at: PlotFraction = CENTRE): string | null {
  const extent = shownExtent(useFourfold.getState());
  if (extent === null) return null;
  return commitExtent(zoomAbout(extent, at, factor), {
    label: factor < 1 ? 'Zoom in' : 'Zoom out',
    kind: factor < 1 ? 'zoom-in' : 'zoom-out',
  });
}

export const zoomIn = (at?: PlotFraction) => zoomMap(ZOOM_STEP, at);
export const zoomOut = (at?: PlotFraction) => zoomMap(1 / ZOOM_STEP, at);

/** The extent "previous extent" would go back to, or null (the button is then disabled). */
export function previousExtent(): ReturnType<typeof previousExtentStep> {
  const { history, setup } = useFourfold.getState();
  return previousExtentStep(history, setup);
}

/** Goes back to the previous extent of the history (as a new step). False when there is none. */
export function backToPreviousExtent(): boolean {
  const found = previousExtent();
  if (found === null) return false;
  const setup = useFourfold.getState().setup;
  commitExtent(found.extent, {
    label: `Back to ${extentName(withExtent(setup, found.extent) as Pick<typeof setup, 'x' | 'y'>)}`,
    kind: 'extent-back',
    backTo: found.step,
  });
  return true;
}
