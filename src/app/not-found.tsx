import Link from "next/link";

export default function NotFound() {
  return (
    <main className="mx-auto max-w-md px-6 py-24 text-center">
      <p className="figure text-sm text-graphite-soft">404</p>
      <h1 className="mt-2 text-2xl font-semibold">Nothing here</h1>
      <p className="mt-2 text-graphite-soft">This page does not exist, or it belongs to someone else.</p>
      <Link href="/" className="btn-quiet mt-6">
        Back to Kilowright
      </Link>
    </main>
  );
}
