"use client";
// The deal's Proposal tab (tablet first): freeze 1–3 offers into a proposal and e-mail its link;
// every version with its state, expiry and what the customer did; revoke, re-send, download.
import Link from "next/link";
import { useState, type FormEvent } from "react";
import { Badge, type BadgeTone } from "@/components/ui/badge";
import { ConfirmButton } from "@/components/ui/dialog";
import { Field, FormMessage, StatusMessage, type Notice } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { fieldErrorsToErrors } from "@/lib/form-errors";
import { formatCents, formatDate, formatDateTime } from "@/lib/format";
import { formatIsoDateLong } from "@/lib/proposal-snapshot";
import { DEFAULT_PROPOSAL_LINK_DAYS } from "@/lib/schemas/proposal";

export type OfferChoice = { id: string; position: number; name: string; contractCents: number; kwDc: number; blockedReason: string | null };
type Status = "sent" | "opened" | "viewed" | "signed" | "replaced" | "revoked" | "cancelled" | "expired";
type State = "live" | "expired" | "revoked" | "replaced" | "signed" | "cancelled";
export type VersionView = {
  id: string;
  label: string;
  version: number;
  status: Status;
  state: State;
  sentAt: string;
  sentToEmail: string;
  sentByName: string | null;
  expiresAt: string;
  inHomeSale: boolean;
  offers: { position: number; name: string; contractCents: number }[];
  chosenPosition: number | null;
  signedAt: string | null;
  signerName: string | null;
  signedSha256: string | null;
  cancelDeadline: string | null;
  cancelledAt: string | null;
  revokedAt: string | null;
  replacedByLabel: string | null;
  events: { id: string; kind: string; body: string | null; ip: string | null; actorName: string | null; createdAt: string }[];
};

const STATUS_LABELS: Record<Status, string> = {
  sent: "Sent",
  opened: "Opened",
  viewed: "Viewed",
  signed: "Signed",
  replaced: "Replaced",
  revoked: "Revoked",
  cancelled: "Cancelled",
  expired: "Expired",
};
const STATUS_TONES: Record<Status, BadgeTone> = {
  sent: "neutral",
  opened: "usage",
  viewed: "usage",
  signed: "success",
  replaced: "neutral",
  revoked: "danger",
  cancelled: "danger",
  expired: "caution",
};
const EVENT_LABELS: Record<string, string> = {
  sent: "Sent",
  resent: "New link sent",
  send_failed: "E-mail could not be sent",
  opened: "Opened by the customer",
  viewed: "Viewed again",
  code_sent: "Signing code sent",
  code_wrong: "Wrong code entered",
  code_verified: "E-mail confirmed with the code",
  consented: "Consented to sign electronically",
  signed: "Signed",
  question: "Question",
  revoked: "Link revoked",
  cancelled: "Cancelled by the buyer",
};

export function ProposalClient({ dealId, householdEmail, hasDesign, offers, versions, timeZone }: { dealId: string; householdEmail: string; hasDesign: boolean; offers: OfferChoice[]; versions: VersionView[]; timeZone: string }) {
  const signed = versions.find((v) => v.state === "signed");
  return (
    <div className="space-y-6">
      {signed ? (
        <FormMessage tone="info">
          {signed.label} is signed. A signed agreement is not replaced by a new version{signed.cancelDeadline ? `; the buyer may cancel until the end of ${formatIsoDateLong(signed.cancelDeadline)}` : ""}.
        </FormMessage>
      ) : !hasDesign || offers.length === 0 ? (
        <FormMessage tone="info">
          A proposal freezes the deal&apos;s offers. Make at least one on the{" "}
          <Link href={`/deals/${dealId}/offers`} className="text-copper underline">
            Offers tab
          </Link>{" "}
          first.
        </FormMessage>
      ) : (
        <SendForm dealId={dealId} householdEmail={householdEmail} offers={offers} live={versions.find((v) => v.state === "live") ?? null} />
      )}
      <section aria-labelledby="versions-heading" className="space-y-3">
        <h2 id="versions-heading" className="text-lg font-semibold">
          Versions sent
        </h2>
        {versions.length === 0 ? <p className="text-graphite-soft">No proposal sent yet.</p> : null}
        {versions.map((v) => (
          <VersionCard key={v.id} v={v} timeZone={timeZone} />
        ))}
      </section>
    </div>
  );
}

/** The form's own checks before it asks the server (which checks the same again). */
function sendFormErrors(picked: string[], toEmail: string, days: number): Record<string, string> {
  const found: Record<string, string> = {};
  if (picked.length === 0) found.offerIds = "Pick at least one offer";
  if (picked.length > 3) found.offerIds = "A proposal holds at most 3 offers";
  if (!/^[^@\s]+@[^@\s]+\.[^@\s]+$/.test(toEmail.trim())) found.toEmail = "Enter a valid e-mail address";
  if (!Number.isInteger(days) || days < 1 || days > 90) found.validDays = "1 to 90 whole days";
  return found;
}

function SendForm({ dealId, householdEmail, offers, live }: { dealId: string; householdEmail: string; offers: OfferChoice[]; live: VersionView | null }) {
  const [picked, setPicked] = useState<string[]>(() => offers.filter((o) => !o.blockedReason).map((o) => o.id));
  const [toEmail, setToEmail] = useState(householdEmail);
  const [validDays, setValidDays] = useState(String(DEFAULT_PROPOSAL_LINK_DAYS));
  const [inHomeSale, setInHomeSale] = useState(true);
  const [message, setMessage] = useState("");
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [outcome, setOutcome] = useState<Notice | null>(null);
  const send = useSave<object, { label: string; mailSent: boolean; mailError: string | null }>({
    request: (json) => ({ url: "/api/proposals", method: "POST", json }),
    notify: setOutcome,
    onFieldErrors: (fields) => setErrors(fieldErrorsToErrors(fields)),
    onSaved: (sent) => {
      setOutcome(
        sent.mailSent
          ? { tone: "success", text: `Proposal ${sent.label} sent to ${toEmail.trim()}.` }
          : { tone: "error", text: `Proposal ${sent.label} was saved, but ${sent.mailError ?? "the e-mail could not be sent."}` },
      );
      setMessage("");
    },
  });

  function toggle(id: string, on: boolean) {
    setPicked((p) => (on ? [...p, id] : p.filter((x) => x !== id)));
  }

  function submit(e: FormEvent) {
    e.preventDefault();
    setOutcome(null);
    const days = Number(validDays);
    const found = sendFormErrors(picked, toEmail, days);
    setErrors(found);
    if (Object.keys(found).length > 0) return;
    send.save({ dealId, offerIds: offers.filter((o) => picked.includes(o.id)).map((o) => o.id), toEmail: toEmail.trim(), message, validDays: days, inHomeSale });
  }

  return (
    <form className="card space-y-4 p-4" onSubmit={submit} noValidate aria-labelledby="send-heading">
      <h2 id="send-heading" className="text-lg font-semibold">
        Send a proposal
      </h2>
      {live ? (
        <p className="rounded-md bg-caution-light px-3 py-2 text-sm">
          Sending makes version {live.version + 1}. The link of {live.label} then shows that it was replaced and can no longer be signed.
        </p>
      ) : null}
      <OfferPicker offers={offers} picked={picked} onToggle={toggle} error={errors.offerIds} />
      <div className="grid gap-4 sm:grid-cols-2">
        <Field id="proposal-to" label="Send to (e-mail)" type="email" value={toEmail} error={errors.toEmail} onChange={(e) => setToEmail(e.target.value)} />
        <Field
          id="proposal-days"
          label="Link valid for (days)"
          type="number"
          inputMode="numeric"
          min={1}
          max={90}
          inputClassName="figure"
          value={validDays}
          error={errors.validDays}
          onChange={(e) => setValidDays(e.target.value)}
        />
      </div>
      <label className="flex min-h-touch items-center gap-3 text-sm">
        <input type="checkbox" className="h-5 w-5 accent-copper" checked={inHomeSale} onChange={(e) => setInHomeSale(e.target.checked)} />
        <span>Sold in the customer&apos;s home (the buyer gets 3 business days to cancel, 16 CFR Part 429)</span>
      </label>
      <div>
        <label htmlFor="proposal-message" className="field-label">
          Message to the customer (optional)
        </label>
        <textarea id="proposal-message" className="field-input min-h-20 py-2" maxLength={2000} value={message} onChange={(e) => setMessage(e.target.value)} />
      </div>
      <button type="submit" className="btn-primary w-full sm:w-auto" disabled={send.pending}>
        {send.pending ? "Sending…" : "Send proposal"}
      </button>
      <StatusMessage notice={outcome} />
    </form>
  );
}

/** The offers to freeze into the proposal; one the rules block is shown but cannot be picked. */
function OfferPicker({ offers, picked, onToggle, error }: { offers: OfferChoice[]; picked: string[]; onToggle: (id: string, on: boolean) => void; error?: string }) {
  return (
    <fieldset>
      <legend className="field-label">Offers to include</legend>
      <div className="space-y-2">
        {offers.map((o) => (
          <label key={o.id} className={`flex min-h-touch items-center gap-3 rounded-md border border-paper-line px-3 ${o.blockedReason ? "bg-paper-deep text-graphite-soft" : "bg-white"}`}>
            <input type="checkbox" className="h-5 w-5 accent-copper" checked={picked.includes(o.id)} disabled={!!o.blockedReason} onChange={(e) => onToggle(o.id, e.target.checked)} />
            <span className="flex-1 py-2">
              <span className="block font-medium">{o.name}</span>
              <span className="block text-sm">
                <span className="figure">{o.kwDc.toFixed(2)} kW DC</span> · <span className="figure">{formatCents(o.contractCents)}</span>
                {o.blockedReason ? ` · ${o.blockedReason}` : ""}
              </span>
            </span>
          </label>
        ))}
      </div>
      {error ? (
        <p className="field-error" role="alert">
          {error}
        </p>
      ) : null}
    </fieldset>
  );
}

function VersionCard({ v, timeZone }: { v: VersionView; timeZone: string }) {
  const [note, setNote] = useState<Notice | null>(null);
  const canRevoke = v.state === "live";
  const canResend = v.state === "live" || v.state === "signed" || v.state === "cancelled";
  const revoke = useSave<void>({ request: () => ({ url: `/api/proposals/${v.id}/revoke`, method: "POST" }), notify: setNote, success: "Link revoked." });
  const resend = useSave<void, { mailSent: boolean; mailError: string | null }>({
    request: () => ({ url: `/api/proposals/${v.id}/resend`, method: "POST" }),
    notify: setNote,
    onSaved: (r) =>
      setNote(r.mailSent ? { tone: "success", text: `New link sent to ${v.sentToEmail}; the earlier link no longer opens.` } : { tone: "error", text: r.mailError ?? "The e-mail could not be sent." }),
  });
  const busy = revoke.pending || resend.pending;

  return (
    <article className="card p-4" aria-label={`Proposal ${v.label}`} data-testid="proposal-version">
      <header className="flex flex-wrap items-center justify-between gap-2">
        <h3 className="figure text-lg font-semibold">{v.label}</h3>
        <Badge tone={STATUS_TONES[v.status]} size="md" testId="proposal-status">
          {STATUS_LABELS[v.status]}
        </Badge>
      </header>
      <VersionFacts v={v} timeZone={timeZone} />
      <div className="mt-3 flex flex-wrap gap-2">
        <a href={`/api/proposals/${v.id}/pdf`} className="btn-quiet" download>
          Download PDF
        </a>
        {v.signedSha256 ? (
          <a href={`/api/proposals/${v.id}/signed-pdf`} className="btn-quiet" download>
            Download signed PDF
          </a>
        ) : null}
        {canResend ? (
          <button type="button" className="btn-quiet" onClick={() => resend.save()} disabled={busy}>
            Re-send link
          </button>
        ) : null}
        {canRevoke ? (
          <ConfirmButton
            danger
            label="Revoke link"
            title={`Revoke the link of ${v.label}?`}
            message="The customer can no longer open or sign it."
            confirmLabel="Revoke the link"
            disabled={busy}
            onConfirm={() => revoke.save()}
          />
        ) : null}
      </div>
      {note ? (
        <div className="mt-3">
          <StatusMessage notice={note} />
        </div>
      ) : null}
      <VersionActivity v={v} timeZone={timeZone} />
    </article>
  );
}

/** When and to whom a version went, what it held, and what happened to it since. */
function VersionFacts({ v, timeZone }: { v: VersionView; timeZone: string }) {
  const chosen = v.offers.find((o) => o.position === v.chosenPosition) ?? null;
  return (
    <dl className="mt-2 grid gap-x-4 gap-y-1 text-sm sm:grid-cols-[auto_1fr]">
      <dt className="text-graphite-soft">Sent</dt>
      <dd>
        {formatDateTime(new Date(v.sentAt), timeZone)} to {v.sentToEmail}
        {v.sentByName ? ` by ${v.sentByName}` : ""}
      </dd>
      <dt className="text-graphite-soft">{v.state === "expired" ? "Expired" : "Link valid until"}</dt>
      <dd>{formatDateTime(new Date(v.expiresAt), timeZone)}</dd>
      <dt className="text-graphite-soft">Offers</dt>
      <dd>
        {v.offers.map((o) => (
          <span key={o.position} className="mr-3 inline-block">
            {o.name} <span className="figure">{formatCents(o.contractCents)}</span>
          </span>
        ))}
      </dd>
      <dt className="text-graphite-soft">In-home sale</dt>
      <dd>{v.inHomeSale ? "Yes: 3-business-day right to cancel" : "No"}</dd>
      {v.signedAt ? (
        <>
          <dt className="text-graphite-soft">Signed</dt>
          <dd>
            {formatDateTime(new Date(v.signedAt), timeZone)} by {v.signerName}
            {chosen ? (
              <>
                , &ldquo;{chosen.name}&rdquo; at <span className="figure">{formatCents(chosen.contractCents)}</span>
              </>
            ) : null}
          </dd>
        </>
      ) : null}
      {v.cancelDeadline ? (
        <>
          <dt className="text-graphite-soft">May cancel until</dt>
          <dd>{formatIsoDateLong(v.cancelDeadline)}</dd>
        </>
      ) : null}
      {v.cancelledAt ? (
        <>
          <dt className="text-graphite-soft">Cancelled</dt>
          <dd>{formatDateTime(new Date(v.cancelledAt), timeZone)}</dd>
        </>
      ) : null}
      {v.revokedAt ? (
        <>
          <dt className="text-graphite-soft">Revoked</dt>
          <dd>{formatDate(new Date(v.revokedAt), timeZone)}</dd>
        </>
      ) : null}
      {v.replacedByLabel ? (
        <>
          <dt className="text-graphite-soft">Replaced by</dt>
          <dd className="figure">{v.replacedByLabel}</dd>
        </>
      ) : null}
    </dl>
  );
}

/** What the customer and the office did with this version, newest first. */
function VersionActivity({ v, timeZone }: { v: VersionView; timeZone: string }) {
  return (
    <details className="mt-3" open={v.state === "live" || v.state === "signed"}>
      <summary className="cursor-pointer text-sm font-medium">Activity ({v.events.length})</summary>
      <ol className="mt-2 space-y-2 text-sm" aria-label={`Activity of ${v.label}`}>
        {v.events
          .slice()
          .reverse()
          .map((e) => (
            <li key={e.id} className="border-l-2 border-paper-line pl-3" data-testid={`event-${e.kind}`}>
              <p>
                <span className="font-medium">{EVENT_LABELS[e.kind] ?? e.kind}</span>
                {e.actorName ? ` · ${e.actorName}` : ""}
                {e.kind !== "question" && e.body ? <span className="text-graphite-soft"> · {e.body}</span> : null}
              </p>
              {e.kind === "question" && e.body ? <p className="mt-1 whitespace-pre-wrap rounded bg-paper-deep px-2 py-1">&ldquo;{e.body}&rdquo;</p> : null}
              <p className="text-xs text-graphite-soft">
                {formatDateTime(new Date(e.createdAt), timeZone)}
                {e.ip ? ` · ${e.ip}` : ""}
              </p>
            </li>
          ))}
      </ol>
    </details>
  );
}
