export default function WeatherLoading() {
  return (
    <div role="status" aria-live="polite" className="text-graphite-soft">
      Loading weather stations…
    </div>
  );
}
