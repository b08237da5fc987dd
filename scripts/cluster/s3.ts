// The local S3-compatible object store of the cluster (s3rver, files under S3_FAKE_DIR): the
// stand-in for a hosted object store, reached by the app through @aws-sdk/client-s3.
import S3rver from "s3rver";

const port = Number(process.env.S3_FAKE_PORT);
const directory = process.env.S3_FAKE_DIR;
const bucket = process.env.S3_FAKE_BUCKET;
if (!port || !directory || !bucket) throw new Error("S3_FAKE_PORT, S3_FAKE_DIR and S3_FAKE_BUCKET are required");

const server = new S3rver({ address: "127.0.0.1", port, directory, silent: true, configureBuckets: [{ name: bucket, configs: [] }] });
await server.run();
console.log(`S3-compatible storage on http://127.0.0.1:${port}, bucket ${bucket}`);
const stop = () => void server.close().finally(() => process.exit(0));
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
