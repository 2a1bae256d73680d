/**
 * The app's configuration, read once from the environment and validated, so a missing or
 * malformed variable fails loudly at start-up instead of deep inside a request.
 */
import { z } from "zod";

const bool = z
  .enum(["true", "false", "1", "0", ""])
  .default("false")
  .transform((v) => v === "true" || v === "1");

const envSchema = z.object({
  DATABASE_URL: z.string().url({ message: "DATABASE_URL must be a postgres:// URL" }),
  APP_URL: z.string().url().default("http://127.0.0.1:3000"),
  NEXTAUTH_SECRET: z.string().min(16, "NEXTAUTH_SECRET must be at least 16 characters"),

  S3_ENDPOINT: z.string().url().optional(),
  S3_REGION: z.string().default("us-east-1"),
  S3_BUCKET: z.string().min(3).default("partproof"),
  S3_ACCESS_KEY_ID: z.string().default("S3RVER"),
  S3_SECRET_ACCESS_KEY: z.string().default("S3RVER"),
  S3_FORCE_PATH_STYLE: bool,

  SMTP_HOST: z.string().default("127.0.0.1"),
  SMTP_PORT: z.coerce.number().int().positive().default(2525),
  SMTP_SECURE: bool,
  SMTP_USER: z.string().optional(),
  SMTP_PASS: z.string().optional(),
  MAIL_FROM: z.string().default("Partproof <no-reply@partproof.invalid>"),
  /** Set while the local inbox is the mail transport; enables the Outbox page. */
  MAIL_INBOX_DIR: z.string().optional(),

  /** Sign-in limits in the window (lib/auth/rate-limit.ts): per account+address pair, per address, per account. */
  SIGNIN_MAX_FAILURES_PER_ACCOUNT_ADDRESS: z.coerce.number().int().positive().default(5),
  SIGNIN_MAX_FAILURES_PER_IP: z.coerce.number().int().positive().default(20),
  SIGNIN_MAX_FAILURES_PER_ACCOUNT: z.coerce.number().int().positive().default(50),
  SIGNIN_WINDOW_MINUTES: z.coerce.number().int().positive().default(15),
  /** How long Take next reserves a unit for the inspector; the Bench renews it while open. */
  QUEUE_LEASE_SECONDS: z.coerce
    .number()
    .int()
    .min(5)
    .max(24 * 3600)
    .default(20 * 60),
});

export type Env = z.infer<typeof envSchema>;

let cached: Env | undefined;

export function env(): Env {
  if (cached) return cached;
  const parsed = envSchema.safeParse(process.env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`);
    throw new Error(`Partproof configuration is invalid:\n${lines.join("\n")}\nSee .env.example.`);
  }
  cached = parsed.data;
  return cached;
}

/** The Outbox exists only while mail goes to the local inbox. */
export function localInboxDir(): string | null {
  return env().MAIL_INBOX_DIR || null;
}
