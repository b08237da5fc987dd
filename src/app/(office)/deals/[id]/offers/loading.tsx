export default function Loading() {
  return (
    <p className="text-graphite-soft" role="status">
      Loading the offers…
    </p>
  );
}
