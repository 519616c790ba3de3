/** The Cut: a line through the plane and its profiles (built in the Cut issue). */
export function CutPanel() {
  return (
    <div className="cut" data-testid="cut">
      <p className="placeholder-note">Cuts are not built yet.</p>
    </div>
  );
}
