// Over HTTP against the running app: a 20 MB chunked body (no Content-Length) to the Stripe
// webhook answers 413 naming the 1 MB cap, and the app does not wait for the rest.
import { request as httpRequest } from "node:http";
import { expect, test } from "@playwright/test";
import { APP_URL } from "./support";

/** Streams `totalBytes` chunked (Transfer-Encoding: chunked), stops writing once an answer arrives. */
function chunkedPost(path: string, totalBytes: number): Promise<{ status: number; body: string; sentBytes: number }> {
  return new Promise((resolve, reject) => {
    let sent = 0;
    let answered = false;
    const req = httpRequest(new URL(path, APP_URL), { method: "POST", headers: { "content-type": "application/json", "stripe-signature": "t=1,v1=00" } }, (res) => {
      answered = true;
      let body = "";
      res.setEncoding("utf8");
      res.on("data", (c: string) => (body += c));
      res.on("end", () => {
        resolve({ status: res.statusCode ?? 0, body, sentBytes: sent });
        req.destroy();
      });
    });
    req.on("error", (err) => (answered ? undefined : reject(err)));
    const chunk = Buffer.alloc(64 * 1024, 0x20);
    const write = () => {
      while (!answered && sent < totalBytes) {
        sent += chunk.length;
        if (!req.write(chunk)) return void req.once("drain", write);
      }
      if (!answered) req.end();
    };
    write();
  });
}

test("a 20 MB chunked POST to the webhook answers 413 before the rest is sent", async () => {
  const res = await chunkedPost("/api/webhooks/stripe", 20 * 1024 * 1024);
  expect(res.status).toBe(413);
  expect(JSON.parse(res.body)).toEqual({ error: { code: "body_too_large", message: expect.stringContaining("up to 1 MB") } });
  // The answer came while the client was still sending: far less than the 20 MB left its side.
  expect(res.sentBytes).toBeLessThan(20 * 1024 * 1024);
});
