import { z } from "zod";

// The one place that reads process.env (STYLE habit 10). Every setting is validated here once; the rest
// of the code imports `env`. Defaults are the local development/demo/test setup: a SQLite file under
// data/, the fake DOI registry and the fake SMTP server on loopback (DESIGN §7).

const DEV_AUTH_SECRET = "fitledger-development-secret-not-for-production";

const schema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  DATABASE_URL: z.string().min(1).default("sqlite:data/fitledger.sqlite"),
  APP_URL: z.url().default("http://localhost:3000"),
  AUTH_SECRET: z.string().min(32, "AUTH_SECRET must be at least 32 characters").optional(),
  SMTP_HOST: z.string().min(1).default("127.0.0.1"),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(2525),
  SMTP_SECURE: z.enum(["true", "false"]).default("false").transform((value) => value === "true"),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  MAIL_FROM: z.string().min(3).default("Fitledger <no-reply@fitledger.test>"),
  DOI_RESOLVER_URL: z.url().default("http://127.0.0.1:4051"),
  DOI_TIMEOUT_MS: z.coerce.number().int().min(100).max(60_000).default(5000),
  FAKE_DOI_PORT: z.coerce.number().int().min(1).max(65535).default(4051),
  FAKE_SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(2525),
  FAKE_SMTP_WEB_PORT: z.coerce.number().int().min(1).max(65535).default(2580),
  PORT: z.coerce.number().int().min(1).max(65535).default(3000),
  FITLEDGER_DEV_TOOLS: z.enum(["on", "off"]).optional(),
});

function load() {
  const parsed = schema.safeParse(process.env);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((issue) => `${issue.path.join(".")}: ${issue.message}`).join("; ");
    throw new Error(`Invalid configuration (see .env.example): ${problems}`);
  }
  const values = parsed.data;
  return {
    ...values,
    /** Development-only pages such as /dev/mail: on outside production unless switched off. */
    devTools: values.FITLEDGER_DEV_TOOLS ? values.FITLEDGER_DEV_TOOLS === "on" : values.NODE_ENV !== "production",
    /** The signing secret; production refuses to run with the development default. */
    authSecret(): string {
      if (values.AUTH_SECRET) return values.AUTH_SECRET;
      if (values.NODE_ENV === "production") throw new Error("AUTH_SECRET must be set in production");
      return DEV_AUTH_SECRET;
    },
  };
}

export const env = load();
export type Env = typeof env;
