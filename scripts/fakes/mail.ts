// Starts the dev outbox (the local fake of the e-mail API) for a demo or test instance.
//   MAIL_FAKE_PORT=4010 MAIL_FAKE_DIR=.data/demo/outbox MAIL_FAKE_API_KEY=re_... tsx scripts/fakes/mail.ts
import { z } from "zod";
import { startMailFake } from "../../src/fakes/mail-server";

const required = { error: "is required" };
const configSchema = z.object({
  MAIL_FAKE_PORT: z
    .string(required)
    .regex(/^\d{1,5}$/, "must be a port number (0 picks a free one)")
    .transform(Number)
    .pipe(z.number().max(65535, "must be at most 65535")),
  MAIL_FAKE_DIR: z.string(required).min(1, "must name a directory for the stored messages"),
  MAIL_FAKE_API_KEY: z.string(required).min(1, "must be the API key the app sends (RESEND_API_KEY)"),
});

const parsed = configSchema.safeParse(process.env);
if (!parsed.success) {
  const lines = parsed.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`);
  console.error(`dev outbox cannot start: invalid configuration\n${lines.join("\n")}`);
  process.exit(1);
}
const config = parsed.data;

const fake = await startMailFake({
  port: config.MAIL_FAKE_PORT,
  dataDir: config.MAIL_FAKE_DIR,
  apiKey: config.MAIL_FAKE_API_KEY,
});
console.log(`dev outbox listening on ${fake.url}`);

let stopping = false;
async function stop(signal: NodeJS.Signals): Promise<void> {
  if (stopping) return;
  stopping = true;
  console.log(`dev outbox stopping (${signal})`);
  try {
    await fake.close();
    process.exit(0);
  } catch (err) {
    console.error("dev outbox: error while stopping", err);
    process.exit(1);
  }
}
process.on("SIGINT", (s) => void stop(s));
process.on("SIGTERM", (s) => void stop(s));
