import type { Metadata } from "next";
import { NoAccess } from "@/components/no-access";
import { devToolsEnabled } from "@/env";
import { formatDateTime } from "@/lib/format";
import { can } from "@/lib/permissions";
import { listOutbox } from "@/server/mail";
import { getCompanySettings } from "@/server/company-settings";
import { getMember } from "@/server/session";
import { notFound } from "next/navigation";

export const metadata: Metadata = { title: "Dev outbox" };

/** Links in a message open in the whole tab, so a person can follow them like in a mail app. */
function withTopTarget(html: string): string {
  return html.includes("<head>") ? html.replace("<head>", '<head><base target="_top">') : `<base target="_top">${html}`;
}

export default async function OutboxPage() {
  if (!devToolsEnabled()) notFound();
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "outbox:read")) return <NoAccess section="the dev outbox" />;
  const [messages, { timeZone }] = await Promise.all([listOutbox({ companyId: member.companyId, limit: 50 }), getCompanySettings(member.companyId)]);
  return (
    <>
      <h1 className="text-2xl font-semibold">Dev outbox</h1>
      <p className="mt-1 text-graphite-soft">
        Every e-mail {member.companyName} has sent from this demo instance, newest first. Nothing here left the machine.
      </p>
      {messages.length === 0 ? <p className="mt-6 text-graphite-soft">No messages yet.</p> : null}
      <ul className="mt-6 space-y-4">
        {messages.map((m) => (
          <li key={m.id} className="card overflow-hidden">
            <details>
              <summary className="flex min-h-touch cursor-pointer flex-wrap items-center justify-between gap-2 px-4 py-2">
                <span className="font-medium">{m.subject}</span>
                <span className="text-sm text-graphite-soft">
                  to {m.to.join(", ")} · {formatDateTime(new Date(m.createdAt), timeZone)}
                </span>
              </summary>
              {m.html ? (
                <iframe
                  title={m.subject}
                  srcDoc={withTopTarget(m.html)}
                  sandbox="allow-top-navigation-by-user-activation allow-popups"
                  className="h-[480px] w-full border-t border-paper-line bg-white"
                />
              ) : (
                <pre className="whitespace-pre-wrap border-t border-paper-line p-4 text-sm">{m.text}</pre>
              )}
            </details>
          </li>
        ))}
      </ul>
    </>
  );
}
