import { useFourfold } from '../store/index';

/** The Probe: the pinned points and the ground state of the selected one. */
export function ProbePanel() {
  const pins = useFourfold((s) => s.probe.pins);
  return (
    <div className="probe" data-testid="probe">
      {pins.length === 0 ? (
        <p className="placeholder-note">
          Click the Map to pin a point and inspect its ground state.
        </p>
      ) : (
        <p>{pins.length} pinned</p>
      )}
    </div>
  );
}
