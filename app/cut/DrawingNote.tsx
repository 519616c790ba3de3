import { useEffect } from 'react';
import { useFourfold } from '../store/index';

/**
 * Says next to the Map that a press on it draws a Cut (not a pin) while the Map's gesture is
 * 'cut', with the way out; Escape leaves the drawing mode (and drops a line being dragged).
 */
export function DrawingNote() {
  const drawing = useFourfold((s) => s.view.mapGesture === 'cut');
  useEffect(() => {
    if (!drawing) return;
    const onKey = (event: KeyboardEvent) => {
      if (event.key !== 'Escape') return;
      const { setMapGesture, setCutDraft } = useFourfold.getState();
      setCutDraft(null);
      setMapGesture('pin');
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [drawing]);
  if (!drawing) return null;
  return (
    <p className="map-drawing-note" role="status" data-testid="map-drawing-note">
      Drawing a Cut: press on the Map, drag and release. Clicks do not pin points until the line is
      drawn or you press Esc.
    </p>
  );
}
