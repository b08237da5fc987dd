/** Shown instead of a section the person's role does not include. */
export function NoAccess({ section }: { section: string }) {
  return (
    <div className="card mx-auto mt-10 max-w-lg p-6" role="alert">
      <h1 className="text-lg font-semibold">No access to {section}</h1>
      <p className="mt-2 text-graphite-soft">Your role does not include this section. Your company&apos;s owner or an admin can change roles.</p>
    </div>
  );
}
