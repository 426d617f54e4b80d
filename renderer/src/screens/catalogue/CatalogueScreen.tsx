export function CatalogueScreen() {
  return <p className="empty">Not yet.</p>;
}
