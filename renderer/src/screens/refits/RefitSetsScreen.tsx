export function RefitSetsScreen() {
  return <p className="empty">Not yet.</p>;
}
