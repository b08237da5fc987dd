import type { Metadata } from "next";
import { ROLE_LABELS } from "@/lib/permissions";
import { findOpenInvitation } from "@/server/people";
import { ClosedLink } from "../../auth-page";
import { AcceptInvitationForm } from "./accept-invitation-form";

export const metadata: Metadata = { title: "Join your company" };

const CLOSED = {
  unknown: "This invitation link is not valid.",
  accepted: "This invitation was already used. Sign in instead.",
  revoked: "This invitation was withdrawn. Ask your admin for a new one.",
  expired: "This invitation has expired. Ask your admin for a new one.",
};

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const found = await findOpenInvitation(token);
  if (found.state !== "open") {
    return <ClosedLink title="Invitation" message={CLOSED[found.state]} href="/sign-in" action="Go to sign in" />;
  }
  const inv = found.invitation;
  return (
    <>
      <h1 className="text-xl font-semibold">Join {inv.companyName}</h1>
      <p className="mt-1 text-sm text-graphite-soft">
        You are invited as <strong className="text-graphite">{ROLE_LABELS[inv.role]}</strong> with the e-mail{" "}
        <strong className="text-graphite">{inv.email}</strong>. Choose your name as colleagues will see it, and a password.
      </p>
      <AcceptInvitationForm token={token} defaultName={inv.name ?? ""} />
    </>
  );
}
