import { z } from 'zod';

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  DATABASE_URL: z.string().url(),
  REDIS_URL: z.string().url(),
  SMTP_URL: z.string().url().default('smtp://127.0.0.1:2525'),
  SESSION_SECRET: z.string().min(16).default('lamella-development-secret-change-me'),
  PUBLIC_URL: z.string().url().default('http://127.0.0.1:5480'),
  API_PORT: z.coerce.number().int().positive().default(5480),
  LAMELLA_DATA_DIR: z.string().default('data'),
  MAIL_FROM: z.string().default('Lamella <no-reply@lamella.invalid>'),
  /** Caught mail is readable in the app only where a local mail catcher stands in for real mail. */
  MAIL_CATCHER: z.enum(['on', 'off']).default('on'),
  SIGN_IN_LIMIT_PER_ACCOUNT: z.coerce.number().int().positive().default(5),
  SIGN_IN_LIMIT_PER_ADDRESS: z.coerce.number().int().positive().default(30),
  SIGN_IN_WINDOW_S: z.coerce.number().int().positive().default(15 * 60),
  UPLOAD_MAX_BYTES: z.coerce.number().int().positive().default(200 * 1024 * 1024),
  TRUST_PROXY: z.enum(['on', 'off']).default('off'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'silent']).default('info'),
});

export type Env = z.infer<typeof envSchema>;

let cached: Env | undefined;

export function env(): Env {
  if (!cached) {
    const parsed = envSchema.safeParse(process.env);
    if (!parsed.success) {
      const fields = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ');
      throw new Error(`Bad environment: ${fields}`);
    }
    cached = parsed.data;
  }
  return cached;
}

/** Tests change the environment between suites. */
export function resetEnvCache() {
  cached = undefined;
}
