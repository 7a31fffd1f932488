import { z } from 'zod';

const secretMissing = (issue: { input: unknown }) =>
  issue.input === undefined ? 'required (npm start makes demo values under DATA_DIR)' : 'must be text';

const port = z.coerce.number({ error: 'must be a port number (1–65535)' }).int().min(1).max(65535);

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: port.default(3000),
  /** Public origin of the app, used for redirects, links in e-mails and the CSRF origin check. */
  APP_ORIGIN: z.url().optional(),
  /** When set, the app uses this server and starts no PostgreSQL of its own. */
  DATABASE_URL: z
    .string()
    .refine((value) => /^postgres(ql)?:\/\/[^\s]+$/.test(value) && URL.canParse(value), {
      message: 'must be a postgres:// URL',
    })
    .optional(),
  /**
   * A streaming replica for reads that may lag a little (history, charts, exports). Writes and
   * authorization always use DATABASE_URL; a replica down or lagging falls back to it.
   */
  DATABASE_REPLICA_URL: z
    .string()
    .refine((value) => /^postgres(ql)?:\/\/[^\s]+$/.test(value) && URL.canParse(value), {
      message: 'must be a postgres:// URL',
    })
    .optional(),
  /** How far behind the primary the replica may be before its reads go to the primary. */
  REPLICA_MAX_LAG_MS: z.coerce.number().int().min(0).default(2_000),
  /**
   * Device readings older than this many whole months are deleted by the daily job; home tests,
   * visit readings and the hourly and daily summaries are kept. Unset keeps everything.
   */
  READINGS_DEVICE_RETENTION_MONTHS: z.coerce.number().int().min(1).optional(),
  PGPORT_LOCAL: port.default(54329),
  DATA_DIR: z.string().min(1).default('.data'),
  /** OpenID provider; the demo runs its own stand-in here. */
  OIDC_ISSUER: z.url().default('http://127.0.0.1:3001'),
  OIDC_CLIENT_ID: z.string().min(1).default('brinewatch-web'),
  /** No default: the demo makes its own under DATA_DIR (api/dev/demo-secrets.ts). */
  OIDC_CLIENT_SECRET: z.string({ error: secretMissing }).min(16),
  /** Signs the session and pre-login cookies; list several (comma-separated) to rotate. */
  SESSION_SECRET: z.string({ error: secretMissing }).min(32),
  SESSION_IDLE_MINUTES: z.coerce
    .number()
    .int()
    .positive()
    .default(8 * 60),
  SESSION_ABSOLUTE_DAYS: z.coerce.number().int().positive().default(7),
  SMTP_HOST: z.string().min(1).default('127.0.0.1'),
  SMTP_PORT: port.default(2525),
  MAIL_FROM: z.string().min(3).default('Brinewatch <no-reply@driftglass.test>'),
  /** Object storage for photos (S3 API); the demo runs a local stand-in. */
  S3_ENDPOINT: z.url().optional().default('http://127.0.0.1:4569'),
  S3_REGION: z.string().min(1).default('us-east-1'),
  S3_BUCKET: z.string().min(3).default('brinewatch-photos'),
  S3_ACCESS_KEY_ID: z.string().min(1).default('S3RVER'),
  S3_SECRET_ACCESS_KEY: z.string().min(1).default('S3RVER'),
  /** Web push (RFC 8292); without keys the app sends no push messages. The demo makes its own. */
  VAPID_PUBLIC_KEY: z
    .string()
    .regex(/^[\w-]{80,90}$/, 'must be a base64url P-256 public key')
    .optional(),
  VAPID_PRIVATE_KEY: z
    .string()
    .regex(/^[\w-]{40,45}$/, 'must be a base64url P-256 private key')
    .optional(),
  VAPID_SUBJECT: z
    .string()
    .regex(/^(mailto:|https:)/, 'must start with mailto: or https:')
    .default('mailto:alerts@driftglass.test'),
  /** PEM of a CA the push sender should trust besides the system's (the demo's local push service). */
  PUSH_TRUSTED_CA_FILE: z.string().min(1).optional(),
  /**
   * The payment provider (hosted checkout). Online payment is offered when both the secret key and
   * the webhook signing secret are set; the demo makes test values under DATA_DIR.
   */
  STRIPE_SECRET_KEY: z
    .string()
    .regex(/^(sk|rk)_(test|live)_\w{8,}$/, 'must be a secret or restricted key (sk_… or rk_…)')
    .optional(),
  STRIPE_WEBHOOK_SECRET: z
    .string()
    .regex(/^whsec_[\w+/=]{8,}$/, 'must be a webhook signing secret (whsec_…)')
    .optional(),
  /** Where the SDK sends its requests instead of the provider's API: the demo's and tests' stand-in. */
  STRIPE_API_URL: z.url().optional(),
  /** The payment stand-in's port in the demo (its API and its hosted payment page). */
  PAYMENTS_PORT: port.default(3032),
  /** The demo's mailbox page (the SMTP stand-in's viewer). */
  MAILBOX_PORT: port.default(3025),
  INVITATION_DAYS: z.coerce.number().int().positive().default(7),
  /** Sign-ins started from one address in 10 minutes (an office shares one address). */
  SIGN_IN_STARTS_PER_10_MIN: z.coerce.number().int().positive().default(20),
  /** How long audit entries are kept before the daily sweep purges them (a year and a month). */
  AUDIT_RETENTION_DAYS: z.coerce.number().int().min(1).default(400),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
});

export type Env = z.infer<typeof envSchema>;

/** Defaults that only fit the demo's object-storage stand-in. */
const standInCredentials = ['S3_ACCESS_KEY_ID', 'S3_SECRET_ACCESS_KEY'] as const;

/** Reads the environment once; a bad value stops the start with one readable line per problem. */
export function parseEnv(source: NodeJS.ProcessEnv = process.env): Env {
  const result = envSchema.safeParse(source);
  const lines = result.success
    ? []
    : result.error.issues.map((issue) => `${issue.path.join('.') || 'environment'}: ${issue.message}`);
  // The stand-in's credentials are public; production must bring its own.
  if (source.NODE_ENV === 'production') {
    for (const name of standInCredentials) if (!source[name]) lines.push(`${name}: required in production`);
  }
  if (!result.success || lines.length > 0) throw new EnvError(lines);
  return result.data;
}

export class EnvError extends Error {
  constructor(readonly problems: string[]) {
    super(`Invalid environment: ${problems.join('; ')}`);
    this.name = 'EnvError';
  }
}

export function appOrigin(env: Env): string {
  return env.APP_ORIGIN ?? `http://localhost:${env.PORT}`;
}

/** For entry points: parse, or print the one-line reason and exit non-zero. */
export function loadEnvOrExit(source: NodeJS.ProcessEnv = process.env): Env {
  try {
    return parseEnv(source);
  } catch (error) {
    if (!(error instanceof EnvError)) throw error;
    console.error(`Brinewatch cannot start: ${error.problems.join('; ')}`);
    process.exit(1);
  }
}
