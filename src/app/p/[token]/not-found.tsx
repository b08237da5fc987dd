export default function ProposalLinkNotFound() {
  return (
    <main className="mx-auto max-w-md px-6 py-20">
      <h1 className="text-2xl font-semibold">This link does not open a proposal</h1>
      <p className="mt-3 text-graphite-soft">
        It may be incomplete, or your installer sent you a newer link (the older one then stops working). Open the link in the newest e-mail from your installer, or ask them
        to send it again.
      </p>
    </main>
  );
}
