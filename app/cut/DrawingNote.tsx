import { useEffect } from 'react';
import { useFourfold } from '../store/index';

/**
 * Says next to the Map what a press on it does when it does not pin: it draws a Cut, or pans
 * the plane; with the way out. Escape leaves either mode (and drops a line being dragged).
 */
export function DrawingNote() {
  const gesture = useFourfold((s) => s.view.mapGesture);
  useEffect(() => {
    if (gesture === 'pin') return;
    const onKey = (event: KeyboardEvent) => {
      if (event.key !== 'Escape') return;
      const { setMapGesture, setCutDraft } = useFourfold.getState();
      setCutDraft(null);
      setMapGesture('pin');
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [gesture]);
  if (gesture === 'cut') {
    return (
      <p className="map-drawing-note" role="status" data-testid="map-drawing-note">
        Drawing a Cut: press on the Map, drag and release. Clicks do not pin points until the line
        is drawn or you press Esc.
      </p>
    );
  }
  if (gesture === 'pan') {
    return (
      <p className="map-drawing-note" role="status" data-testid="map-pan-note">
        Panning: drag the plane. Clicks do not pin points until you press Esc or choose Pin.
      </p>
    );
  }
  return null;
}
