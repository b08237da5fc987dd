import Link from "next/link";

/** Another crew's job, another company's, or no such job: all look the same. */
export default function JobNotFound() {
  return (
    <div className="mx-auto max-w-md py-16 text-center">
      <p className="figure text-sm text-graphite-soft">404</p>
      <h1 className="mt-2 text-2xl font-semibold">Job not found</h1>
      <p className="mt-2 text-graphite-soft">This job does not exist, or it is not one of yours.</p>
      <Link href="/jobs" className="btn-quiet mt-6">
        Back to your jobs
      </Link>
    </div>
  );
}
