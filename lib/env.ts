import { z } from "zod";

/**
 * All configuration comes from the environment and is parsed here once.
 * A bad value stops start-up with a message that names the variable.
 */
const minutes = (fallback: number) => z.coerce.number().int().positive().default(fallback);

const envSchema = z
  .object({
    NODE_ENV: z.enum(["development", "test", "production"]).default("development"),
    DATABASE_URL: z
      .string()
      .default("file:./data/washproof.db")
      .refine((u) => /^(file:|libsql:\/\/|https?:\/\/|wss?:\/\/)/.test(u), {
        message: "must start with file:, libsql://, http(s):// or ws(s)://",
      }),
    DATABASE_AUTH_TOKEN: z.string().optional(),
    SESSION_IDLE_MINUTES: minutes(30),
    SESSION_ABSOLUTE_MINUTES: minutes(12 * 60),
    LOCKOUT_THRESHOLD: z.coerce.number().int().min(1).max(100).default(5),
    LOCKOUT_MINUTES: minutes(15),
    /** Failed sign-ins one source address may make within the window before it is refused for a while. */
    SIGN_IN_ADDRESS_LIMIT: z.coerce.number().int().min(1).max(1000).default(10),
    SIGN_IN_ADDRESS_WINDOW_MINUTES: minutes(15),
    SIGN_IN_ADDRESS_BLOCK_MINUTES: minutes(15),
    /**
     * Reverse proxies in front of the app that append to X-Forwarded-For. The source address is
     * the entry the outermost trusted proxy wrote; 0 means none (the app is reached directly).
     */
    TRUSTED_PROXY_HOPS: z.coerce.number().int().min(0).max(10).default(0),
    SMTP_URL: z.string().url().default("smtp://127.0.0.1:2525"),
    MAIL_FROM: z.string().default("Washproof <no-reply@washproof.local>"),
    /** Where the local capturing SMTP server (demo and tests) keeps what it receives. */
    MAILBOX_FILE: z.string().default("./data/mailbox.jsonl"),
    REVIEW_OVERDUE_DAYS: z.coerce.number().int().positive().max(365).default(5),
    UPLOAD_DIR: z.string().default("./data/uploads"),
    UPLOAD_MAX_MB: z.coerce.number().positive().max(1024).default(25),
    /** PDFs render in a child process with this heap cap and time limit, one at a time. */
    PDF_MEMORY_MB: z.coerce.number().int().min(128).max(8192).default(512),
    PDF_TIMEOUT_SECONDS: z.coerce.number().int().min(5).max(600).default(60),
    /** Where evidence bytes live: the local disk (UPLOAD_DIR) or S3-compatible object storage. */
    STORAGE_DRIVER: z.enum(["local", "s3"]).default("local"),
    S3_ENDPOINT: z.string().url().optional(),
    S3_REGION: z.string().default("us-east-1"),
    S3_BUCKET: z.string().optional(),
    S3_ACCESS_KEY_ID: z.string().optional(),
    S3_SECRET_ACCESS_KEY: z.string().optional(),
    S3_FORCE_PATH_STYLE: z
      .enum(["true", "false", "1", "0"])
      .default("true")
      .transform((v) => v === "true" || v === "1"),

    /**
     * The Ed25519 private key (PKCS#8 PEM) that signs audit checkpoints: the PEM text
     * itself, or a file holding it. Keep it off the database's disk and its backups.
     */
    AUDIT_SIGNING_KEY: z.string().optional(),
    AUDIT_SIGNING_KEY_FILE: z.string().optional(),
    /** How often the chain head is checkpointed when it has moved. */
    AUDIT_CHECKPOINT_MINUTES: minutes(60),
    /** Who receives a copy of every checkpoint by e-mail (an auditor outside the company, ideally). */
    AUDITOR_EMAIL: z
      .string()
      .trim()
      .toLowerCase()
      .email()
      .optional()
      .or(z.literal("").transform(() => undefined)),

    APP_URL: z.string().url().default("http://localhost:3000"),
    DEMO_MODE: z
      .enum(["true", "false", "1", "0"])
      .default("false")
      .transform((v) => v === "true" || v === "1"),
  })
  .superRefine((env, ctx) => {
    // A relative file: URL resolves against the working directory, which differs
    // between `next start`, standalone output and scripts: demand an absolute one.
    if (env.NODE_ENV === "production" && env.DATABASE_URL.startsWith("file:")) {
      const path = env.DATABASE_URL.slice("file:".length);
      if (!path.startsWith("/")) {
        ctx.addIssue({
          code: "custom",
          path: ["DATABASE_URL"],
          message:
            "must be an absolute file: path in production (e.g. file:/var/lib/washproof/app.db)",
        });
      }
    }
    if (env.STORAGE_DRIVER === "s3" && !env.S3_BUCKET) {
      ctx.addIssue({
        code: "custom",
        path: ["S3_BUCKET"],
        message: "is required when STORAGE_DRIVER is s3",
      });
    }
    if (env.AUDIT_SIGNING_KEY && env.AUDIT_SIGNING_KEY_FILE) {
      ctx.addIssue({
        code: "custom",
        path: ["AUDIT_SIGNING_KEY_FILE"],
        message: "set either AUDIT_SIGNING_KEY or AUDIT_SIGNING_KEY_FILE, not both",
      });
    }
    if (env.SESSION_IDLE_MINUTES > env.SESSION_ABSOLUTE_MINUTES) {
      ctx.addIssue({
        code: "custom",
        path: ["SESSION_IDLE_MINUTES"],
        message: "must not exceed SESSION_ABSOLUTE_MINUTES",
      });
    }
  });

export type Env = z.infer<typeof envSchema>;

export function parseEnv(source: Record<string, string | undefined>): Env {
  const result = envSchema.safeParse(source);
  if (!result.success) {
    const lines = result.error.issues.map((i) => `  ${i.path.join(".") || "(env)"}: ${i.message}`);
    throw new Error(`Invalid configuration:\n${lines.join("\n")}`);
  }
  return result.data;
}

let cached: Env | undefined;

export function env(): Env {
  cached ??= parseEnv(process.env);
  return cached;
}
