// Starts the dev payments server (the local fake of the Stripe API) for a demo or test instance.
//   PAYMENTS_FAKE_PORT=3520 PAYMENTS_FAKE_DIR=.data/demo/payments PAYMENTS_FAKE_API_KEY=sk_test_… \
//   PAYMENTS_FAKE_WEBHOOK_URL=http://localhost:3000/api/webhooks/stripe PAYMENTS_FAKE_WEBHOOK_SECRET=whsec_… \
//   tsx scripts/fakes/payments.ts
// Optional: PAYMENTS_FAKE_RETRY_INITIAL_MS and PAYMENTS_FAKE_RETRY_MAX_MS (webhook back-off).
import { z } from "zod";
import { startPaymentsFake } from "../../src/fakes/payments-server";

const required = { error: "is required" };
const milliseconds = z
  .string()
  .regex(/^\d{1,9}$/, "must be a number of milliseconds")
  .transform(Number)
  .optional();
const configSchema = z.object({
  PAYMENTS_FAKE_PORT: z
    .string(required)
    .regex(/^\d{1,5}$/, "must be a port number (0 picks a free one)")
    .transform(Number)
    .pipe(z.number().max(65535, "must be at most 65535")),
  PAYMENTS_FAKE_DIR: z.string(required).min(1, "must name a directory for the stored state"),
  PAYMENTS_FAKE_API_KEY: z.string(required).regex(/^sk_test_\w+$/, "must be the test secret key the app sends (STRIPE_SECRET_KEY, sk_test_…)"),
  PAYMENTS_FAKE_WEBHOOK_URL: z.url("must be the app's webhook URL, e.g. http://localhost:3000/api/webhooks/stripe"),
  PAYMENTS_FAKE_WEBHOOK_SECRET: z.string(required).regex(/^whsec_\w+$/, "must be the webhook signing secret the app checks (STRIPE_WEBHOOK_SECRET, whsec_…)"),
  PAYMENTS_FAKE_RETRY_INITIAL_MS: milliseconds,
  PAYMENTS_FAKE_RETRY_MAX_MS: milliseconds,
});

const parsed = configSchema.safeParse(process.env);
if (!parsed.success) {
  const lines = parsed.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`);
  console.error(`dev payments cannot start: invalid configuration\n${lines.join("\n")}`);
  process.exit(1);
}
const config = parsed.data;

const fake = await startPaymentsFake({
  port: config.PAYMENTS_FAKE_PORT,
  dataDir: config.PAYMENTS_FAKE_DIR,
  apiKey: config.PAYMENTS_FAKE_API_KEY,
  webhookUrl: config.PAYMENTS_FAKE_WEBHOOK_URL,
  webhookSecret: config.PAYMENTS_FAKE_WEBHOOK_SECRET,
  retry: { initialDelayMs: config.PAYMENTS_FAKE_RETRY_INITIAL_MS, maxDelayMs: config.PAYMENTS_FAKE_RETRY_MAX_MS },
  log: (line) => console.log(`${new Date().toISOString()} ${line}`),
});
console.log(`dev payments listening on ${fake.url} (webhooks to ${config.PAYMENTS_FAKE_WEBHOOK_URL})`);

let stopping = false;
async function stop(signal: NodeJS.Signals): Promise<void> {
  if (stopping) return;
  stopping = true;
  console.log(`dev payments stopping (${signal})`);
  try {
    await fake.close();
    process.exit(0);
  } catch (err) {
    console.error("dev payments: error while stopping", err);
    process.exit(1);
  }
}
process.on("SIGINT", (s) => void stop(s));
process.on("SIGTERM", (s) => void stop(s));
