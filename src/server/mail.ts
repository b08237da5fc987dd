import "server-only";
// The one way the app sends e-mail: React Email templates (emails/) rendered to HTML and plain
// text, sent through the Resend SDK. In demo and test instances RESEND_BASE_URL points the SDK
// at the dev outbox (src/fakes/mail-server.ts), which also lists what was sent.
import { render } from "@react-email/render";
import type { ReactElement } from "react";
import { Resend } from "resend";
import { z } from "zod";
import { devToolsEnabled, env } from "@/env";
import { outboxMessageSchema } from "@/lib/schemas/outbox";

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

/** The tag naming the company a message belongs to; the dev outbox lists a company's mail by it. */
export const COMPANY_TAG = "company_id";

export interface SendEmailInput {
  /** The company the message belongs to (mail is one company's record, like any other). */
  companyId: string;
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
export async function sendEmail({ react, ...rest }: SendEmailInput): Promise<{ id: string }> {
  const [html, text] = await Promise.all([render(react), render(react, { plainText: true })]);
  return sendRendered({ ...rest, html, text });
}

export type RenderedEmail = Omit<SendEmailInput, "react"> & { html: string; text: string };

/** Sends an already rendered message (the mail outbox keeps them rendered). Throws MailSendError. */
export async function sendRendered({ companyId, to, subject, html, text, replyTo, idempotencyKey }: RenderedEmail): Promise<{ id: string }> {
  let answer: Awaited<ReturnType<Resend["emails"]["send"]>>;
  try {
    answer = await resend().emails.send(
      { from: env().MAIL_FROM, to, subject, html, text, tags: [{ name: COMPANY_TAG, value: companyId }], ...(replyTo === undefined ? {} : { replyTo }) },
      idempotencyKey === undefined ? undefined : { idempotencyKey },
    );
  } catch (err) {
    throw new MailSendError("application_error", `The mail service cannot be reached: ${err instanceof Error ? err.message : String(err)}`, null);
  }
  const { data, error } = answer;
  if (error) throw new MailSendError(error.name, error.message, error.statusCode);
  if (!data) throw new MailSendError("application_error", "The mail service answered without an id.", null);
  return { id: data.id };
}

// ---------------------------------------------------------------------------------------------
// Dev outbox (demo and test instances only)

export type OutboxMessage = z.infer<typeof outboxMessageSchema>;

const outboxListSchema = z.object({ data: z.array(outboxMessageSchema) });
const serviceErrorSchema = z.object({ name: z.string(), message: z.string() });

/**
 * One company's messages in the dev outbox, newest first; `to` keeps those addressed (to, cc or
 * bcc) to one address. A company sees only the mail it sent (the company tag of sendRendered).
 */
export async function listOutbox({ companyId, to, limit }: { companyId: string; to?: string; limit?: number }): Promise<OutboxMessage[]> {
  const { RESEND_BASE_URL, RESEND_API_KEY } = env();
  if (!RESEND_BASE_URL || !devToolsEnabled()) {
    throw new Error(
      "The dev outbox is not configured: RESEND_BASE_URL is not set (or APP_MODE is production), so e-mail goes to the real service and there is no local outbox to list.",
    );
  }
  const url = new URL(`${RESEND_BASE_URL}/dev/messages`);
  url.searchParams.set("company", companyId);
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
