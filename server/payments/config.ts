/**
 * The payment piece of the environment. Without real keys the app talks to the local test payment service
 * (server/fakes/payment-fake.ts) on 127.0.0.1; with a real-looking `STRIPE_SECRET_KEY` (and its
 * `STRIPE_WEBHOOK_SECRET`) the same code talks to the hosted service.
 */
import { z } from "zod";

/** The local defaults, only ever used with the local fake. */
export const LOCAL_FAKE_SECRET_KEY = "sk_test_local_fake";
export const LOCAL_FAKE_WEBHOOK_SECRET = "whsec_local_fake";
export const DEFAULT_PAYMENT_FAKE_PORT = 12111;

/** A key as the provider issues them: `sk_`/`rk_`, `test_`/`live_`, then a long alphanumeric tail. */
const REAL_KEY = /^(sk|rk)_(test|live)_[0-9A-Za-z]{20,}$/;
export const looksLikeRealKey = (key: string | undefined) => Boolean(key && REAL_KEY.test(key));

const optionalBool = z
  .enum(["1", "0", "true", "false", "yes", "no", ""])
  .optional()
  .transform((v) => (v === undefined || v === "" ? undefined : v === "1" || v === "true" || v === "yes"));

const blankToUndefined = (v: unknown) => (typeof v === "string" && v.trim() === "" ? undefined : v);

export const paymentEnvSchema = z.object({
  STRIPE_SECRET_KEY: z.preprocess(blankToUndefined, z.string().trim().optional()),
  STRIPE_WEBHOOK_SECRET: z.preprocess(blankToUndefined, z.string().trim().optional()),
  /** 0 = any free port (tests). */
  PAYMENT_FAKE_PORT: z.coerce.number().int().min(0).max(65535).default(DEFAULT_PAYMENT_FAKE_PORT),
  /** Forces the choice; unset = the fake unless STRIPE_SECRET_KEY looks real. */
  PAYMENTS_USE_FAKE: optionalBool,
});

export interface PaymentConfig {
  /** true: start the local fake and point the SDK at it. */
  useFake: boolean;
  secretKey: string;
  webhookSecret: string;
  /** Where the fake listens (only when useFake). The port may be 0: use the port the fake reports. */
  fake: { host: "127.0.0.1"; port: number } | null;
}

/** Parses the payment variables; a bad or contradictory combination throws with a clear message. */
export function loadPaymentConfig(env: NodeJS.ProcessEnv = process.env): PaymentConfig {
  const parsed = paymentEnvSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`).join("\n");
    throw new Error(`Invalid payment settings:\n${lines}`);
  }
  const e = parsed.data;
  const useFake = e.PAYMENTS_USE_FAKE ?? !looksLikeRealKey(e.STRIPE_SECRET_KEY);

  if (useFake) {
    const secretKey = e.STRIPE_SECRET_KEY ?? LOCAL_FAKE_SECRET_KEY;
    if (!secretKey.startsWith("sk_test_")) {
      throw new Error("PAYMENTS_USE_FAKE: the local test payment service takes a test key (sk_test_…); never give it a live key");
    }
    return {
      useFake: true,
      secretKey,
      webhookSecret: e.STRIPE_WEBHOOK_SECRET ?? LOCAL_FAKE_WEBHOOK_SECRET,
      fake: { host: "127.0.0.1", port: e.PAYMENT_FAKE_PORT },
    };
  }

  if (!e.STRIPE_SECRET_KEY) throw new Error("STRIPE_SECRET_KEY is required when PAYMENTS_USE_FAKE=false");
  if (!/^(sk|rk)_(test|live)_/.test(e.STRIPE_SECRET_KEY)) {
    throw new Error("STRIPE_SECRET_KEY must be a secret or restricted key (sk_… or rk_…)");
  }
  if (!e.STRIPE_WEBHOOK_SECRET || !e.STRIPE_WEBHOOK_SECRET.startsWith("whsec_") || e.STRIPE_WEBHOOK_SECRET === LOCAL_FAKE_WEBHOOK_SECRET) {
    throw new Error("STRIPE_WEBHOOK_SECRET (whsec_…, from the webhook endpoint's settings) is required with a real STRIPE_SECRET_KEY");
  }
  return { useFake: false, secretKey: e.STRIPE_SECRET_KEY, webhookSecret: e.STRIPE_WEBHOOK_SECRET, fake: null };
}
