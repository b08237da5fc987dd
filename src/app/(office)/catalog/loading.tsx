export default function CatalogLoading() {
  return (
    <div role="status" aria-live="polite" className="text-graphite-soft">
      Loading the catalog…
    </div>
  );
}
