import { useFourfold } from '../store/index';
import type { MapGesture } from '../store/viewSlice';
import { backToPreviousExtent, zoomIn, zoomOut } from './mapNavigation';
import { previousExtentStep } from './previousExtent';

const MODES: readonly { gesture: MapGesture; text: string; title: string }[] = [
  {
    gesture: 'pin',
    text: 'Pin',
    title: 'A click pins a point for the Probe; a drag zooms to the box it draws',
  },
  { gesture: 'pan', text: 'Pan', title: 'A drag moves the plane (Shift+drag does it in any mode)' },
  { gesture: 'cut', text: 'Draw a Cut', title: 'A drag draws a straight Cut through the Map' },
];

/**
 * Above the Map: what a press on it does (pin, pan, draw a Cut; Escape goes back to pinning),
 * zoom in and out about the centre, and back to the previous extent of the history.
 */
export function MapToolbar() {
  const gesture = useFourfold((s) => s.view.mapGesture);
  const hasGrid = useFourfold((s) => s.map.grid !== null);
  const canGoBack = useFourfold((s) => previousExtentStep(s.history, s.setup) !== null);
  const setMapGesture = useFourfold((s) => s.setMapGesture);
  return (
    <div className="map-toolbar">
      <div className="map-tool-group" role="group" aria-label="What a press on the Map does">
        {MODES.map((mode) => (
          <button
            key={mode.gesture}
            type="button"
            className="map-tool"
            aria-pressed={gesture === mode.gesture}
            title={mode.title}
            data-testid={`map-mode-${mode.gesture}`}
            onClick={() => setMapGesture(gesture === mode.gesture ? 'pin' : mode.gesture)}
          >
            {mode.text}
          </button>
        ))}
      </div>
      <div className="map-tool-group" role="group" aria-label="Extent">
        <button
          type="button"
          className="map-tool"
          disabled={!hasGrid}
          title="Zoom in about the centre (+ on the Map zooms about the crosshair)"
          data-testid="map-zoom-in"
          onClick={() => zoomIn()}
        >
          Zoom in
        </button>
        <button
          type="button"
          className="map-tool"
          disabled={!hasGrid}
          title="Zoom out about the centre (− on the Map zooms about the crosshair)"
          data-testid="map-zoom-out"
          onClick={() => zoomOut()}
        >
          Zoom out
        </button>
        <button
          type="button"
          className="map-tool"
          disabled={!canGoBack}
          title="Back to the extent shown before (from the undo history)"
          data-testid="map-extent-back"
          onClick={() => backToPreviousExtent()}
        >
          Previous extent
        </button>
      </div>
    </div>
  );
}
