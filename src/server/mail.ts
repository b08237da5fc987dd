import "server-only";
// The one way the app sends e-mail: React Email templates (emails/) rendered to HTML and plain
// text, sent through the Resend SDK. In demo and test instances RESEND_BASE_URL points the SDK
// at the dev outbox (src/fakes/mail-server.ts), which also lists what was sent.
import { render } from "@react-email/render";
import type { ReactElement } from "react";
import { Resend } from "resend";
import { z } from "zod";
import { env } from "@/env";

/** The service refused a message (or could not be reached); `code` is the service's error name. */
export class MailSendError extends Error {
  constructor(
    readonly code: string,
    message: string,
    /** HTTP status from the service; null when it could not be reached. */
    readonly statusCode: number | null,
  ) {
    super(message);
    this.name = "MailSendError";
  }
}

export interface SendEmailInput {
  to: string | string[];
  subject: string;
  /** An element of one of the templates in emails/. */
  react: ReactElement;
  replyTo?: string | string[];
  /** Same key and same content within 24 h sends once; use it when a send may be retried. */
  idempotencyKey?: string;
}

let client: Resend | undefined;

/** One client per process, built on first use so configuration is read only when mail is sent. */
function resend(): Resend {
  if (!client) {
    const { RESEND_API_KEY, RESEND_BASE_URL } = env();
    // The SDK's constructor option; without it the SDK falls back to the RESEND_BASE_URL
    // environment variable and then to the public service.
    client = new Resend(RESEND_API_KEY, RESEND_BASE_URL ? { baseUrl: RESEND_BASE_URL } : undefined);
  }
  return client;
}

/** Renders the template to HTML and plain text, sends it, and returns the service's id. Throws MailSendError. */
export async function sendEmail({ to, subject, react, replyTo, idempotencyKey }: SendEmailInput): Promise<{ id: string }> {
  const [html, text] = await Promise.all([render(react), render(react, { plainText: true })]);
  const { data, error } = await resend().emails.send(
    { from: env().MAIL_FROM, to, subject, html, text, ...(replyTo === undefined ? {} : { replyTo }) },
    idempotencyKey === undefined ? undefined : { idempotencyKey },
  );
  if (error) throw new MailSendError(error.name, error.message, error.statusCode);
  if (!data) throw new MailSendError("application_error", "The mail service answered without an id.", null);
  return { id: data.id };
}

// ---------------------------------------------------------------------------------------------
// Dev outbox (demo and test instances only)

export const outboxMessageSchema = z.object({
  id: z.string(),
  from: z.string(),
  to: z.array(z.string()),
  cc: z.array(z.string()),
  bcc: z.array(z.string()),
  replyTo: z.array(z.string()),
  subject: z.string(),
  html: z.string().nullable(),
  text: z.string().nullable(),
  headers: z.record(z.string(), z.string()),
  tags: z.array(z.object({ name: z.string(), value: z.string() })),
  createdAt: z.string(),
});
export type OutboxMessage = z.infer<typeof outboxMessageSchema>;

const outboxListSchema = z.object({ data: z.array(outboxMessageSchema) });
const serviceErrorSchema = z.object({ name: z.string(), message: z.string() });

/** Messages the dev outbox holds, newest first; `to` keeps those addressed (to, cc or bcc) to one address. */
export async function listOutbox({ to, limit }: { to?: string; limit?: number } = {}): Promise<OutboxMessage[]> {
  const { RESEND_BASE_URL, RESEND_API_KEY } = env();
  if (!RESEND_BASE_URL) {
    throw new Error(
      "The dev outbox is not configured: RESEND_BASE_URL is not set, so e-mail goes to the real service and there is no local outbox to list.",
    );
  }
  const url = new URL(`${RESEND_BASE_URL}/dev/messages`);
  if (to !== undefined) url.searchParams.set("to", to);
  if (limit !== undefined) url.searchParams.set("limit", String(limit));
  let res: Response;
  try {
    res = await fetch(url, { headers: { Authorization: `Bearer ${RESEND_API_KEY}` }, cache: "no-store" });
  } catch (err) {
    throw new Error(`The dev outbox at ${RESEND_BASE_URL} cannot be reached; is it running?`, { cause: err });
  }
  const body: unknown = await res.json().catch(() => null);
  if (!res.ok) {
    const problem = serviceErrorSchema.safeParse(body);
    const detail = problem.success ? `${problem.data.name}: ${problem.data.message}` : `HTTP ${res.status}`;
    throw new Error(`The dev outbox refused the request (${detail})`);
  }
  const parsed = outboxListSchema.safeParse(body);
  if (!parsed.success) throw new Error(`The dev outbox answered in an unexpected shape: ${parsed.error.message}`);
  return parsed.data.data;
}
