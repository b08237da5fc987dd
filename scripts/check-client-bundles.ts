// `npx tsx scripts/check-client-bundles.ts`: after `next build`, fails when a client chunk contains drizzle.
import { checkClientBundles } from "./lib/client-bundles";
import { projectRoot } from "./lib/instance";

process.exit(checkClientBundles(projectRoot) ? 0 : 1);
