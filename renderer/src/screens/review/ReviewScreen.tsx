export function ReviewScreen() {
  return <p className="empty">Not yet.</p>;
}
