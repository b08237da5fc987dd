import type { StripeApiError } from "./errors";
import type { Params } from "./params";
import type { PaymentsStore } from "./store";
import type { WebhookSender } from "./webhooks";

// ── Shared state and request context ──────────────────────────────────────────────

/** The fake's state, shared by its modules (one per server). */
export interface FakeContext {
  store: PaymentsStore;
  sender: WebhookSender;
  /** Event types delivered to the webhook URL. */
  webhookEvents: Set<string>;
  apiKey: string;
  /** Base of the hosted page links; set once listening. */
  baseUrl: string;
  expiryTimer: NodeJS.Timeout | null;
  closed: boolean;
}

/** The API version of the installed SDK (stripe 23); the tests check they agree. */
export const API_VERSION = "2026-10-28.endive";

export interface RequestInfo {
  id: string | null;
  idempotencyKey: string | null;
}
export const AUTOMATIC: RequestInfo = { id: null, idempotencyKey: null };

export interface ApiResult {
  status: number;
  body: unknown;
}

/** One API call as a resource's routes see it; `unrecognized` is the 404 for a path no route has. */
export interface ApiCall {
  method: string;
  parts: string[];
  params: Params;
  request: RequestInfo;
  unrecognized: () => StripeApiError;
}

export const ok = (body: unknown): ApiResult => ({ status: 200, body });
