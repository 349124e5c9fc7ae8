/**
 * `tsx scripts/payment-fake.ts`: runs the local test payment service on its own.
 *   PAYMENT_FAKE_PORT      port on 127.0.0.1 (default 12111; 0 = any free port)
 *   WEBHOOK_URL            where signed events go, e.g. http://127.0.0.1:3000/api/payments/webhook
 *   STRIPE_WEBHOOK_SECRET  signing secret shared with the app (default whsec_local_fake)
 *   PAYMENT_FAKE_PUBLIC_URL optional base URL the browser uses for the payment pages
 * Point the app at it with PAYMENTS_USE_FAKE=true (the default without real keys). Ctrl-C stops it.
 */
import { z } from "zod";
import { startPaymentFake } from "../server/fakes/payment-fake";
import { DEFAULT_PAYMENT_FAKE_PORT, LOCAL_FAKE_WEBHOOK_SECRET } from "../server/payments/config";

const env = z
  .object({
    PAYMENT_FAKE_PORT: z.coerce.number().int().min(0).max(65535).default(DEFAULT_PAYMENT_FAKE_PORT),
    WEBHOOK_URL: z.url().optional(),
    STRIPE_WEBHOOK_SECRET: z.string().min(1).default(LOCAL_FAKE_WEBHOOK_SECRET),
    PAYMENT_FAKE_PUBLIC_URL: z.url().optional(),
  })
  .parse(process.env);

const fake = await startPaymentFake({
  port: env.PAYMENT_FAKE_PORT,
  host: "127.0.0.1",
  webhookUrl: env.WEBHOOK_URL,
  webhookSecret: env.STRIPE_WEBHOOK_SECRET,
  publicUrl: env.PAYMENT_FAKE_PUBLIC_URL,
  log: (m) => console.log(m),
});

console.log(`Local TEST payment service: ${fake.url}`);
console.log(env.WEBHOOK_URL ? `Webhooks → ${env.WEBHOOK_URL}` : "No WEBHOOK_URL: events are recorded but not sent");
console.log(`SDK settings: new Stripe("sk_test_…", { host: "127.0.0.1", port: ${fake.port}, protocol: "http", maxNetworkRetries: 0, telemetry: false })`);

const stop = async () => {
  await fake.close();
  process.exit(0);
};
process.once("SIGINT", () => void stop());
process.once("SIGTERM", () => void stop());
