export function CountsScreen() {
  return <p className="empty">Not yet.</p>;
}
