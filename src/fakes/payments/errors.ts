// Errors in Stripe's shape: `{ error: { type, code, message, param, ... } }` with the HTTP
// status the SDK maps to its error classes (400/404 → StripeInvalidRequestError, or
// StripeIdempotencyError for type idempotency_error; 401 → StripeAuthenticationError;
// 402 → StripeCardError; 5xx → StripeAPIError).

export type StripeErrorType = "invalid_request_error" | "card_error" | "idempotency_error" | "api_error";

export interface StripeErrorBody {
  type: StripeErrorType;
  message: string;
  code?: string;
  param?: string;
  decline_code?: string;
  doc_url?: string;
  payment_intent?: unknown;
  request_log_url?: string;
}

export class StripeApiError extends Error {
  constructor(
    readonly status: number,
    readonly error: StripeErrorBody,
  ) {
    super(error.message);
  }

  body(): { error: StripeErrorBody } {
    const e: StripeErrorBody = { ...this.error };
    if (e.code && !e.doc_url) e.doc_url = `https://stripe.com/docs/error-codes/${e.code.replace(/_/g, "-")}`;
    return { error: e };
  }
}

export const invalidRequest = (message: string, param?: string, code?: string, status = 400) =>
  new StripeApiError(status, { type: "invalid_request_error", message, ...(param ? { param } : {}), ...(code ? { code } : {}) });

export const missingParam = (param: string) => invalidRequest(`Missing required param: ${param}.`, param, "parameter_missing");

export const unknownParam = (param: string) =>
  invalidRequest(
    `Received unknown parameter: ${param}. (This dev payments server accepts the Stripe parameters Kilowright uses; see src/fakes/payments-server.ts.)`,
    param,
    "parameter_unknown",
  );

export const invalidParam = (param: string, message: string, code = "parameter_invalid_string") => invalidRequest(message, param, code);

export const invalidInteger = (param: string, raw: string) => invalidRequest(`Invalid integer: ${raw}`, param, "parameter_invalid_integer");

/** 404 resource_missing, worded like the API: "No such checkout.session: 'cs_test_…'". */
export const noSuch = (objectName: string, id: string, param: string) =>
  invalidRequest(`No such ${objectName}: '${id}'`, param, "resource_missing", 404);
