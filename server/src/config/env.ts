import { z } from 'zod';

/**
 * The one place that reads process.env. Every setting has a safe local default so that a
 * fresh clone runs without a .env file; production overrides them (see .env.example).
 */
const port = z.coerce.number().int().min(1).max(65535);

export const configSchema = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: port.default(8080),
  PUBLIC_URL: z.url().optional(),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),

  DATA_DIR: z.string().min(1).default('.data/dev'),
  DB_HOST: z.string().min(1).default('127.0.0.1'),
  DB_PORT: port.default(3307),
  DB_NAME: z
    .string()
    .regex(/^[A-Za-z0-9_]{1,64}$/, 'letters, digits and underscores only')
    .default('ingotrace'),
  DB_USER: z.string().min(1).max(80).default('ingotrace_app'),
  DB_PASSWORD: z.string().min(1).default('local-app-password'),
  DB_MIGRATION_USER: z.string().min(1).max(80).default('ingotrace_migrator'),
  DB_MIGRATION_PASSWORD: z.string().min(1).default('local-migration-password'),
  DB_POOL_SIZE: z.coerce.number().int().min(1).max(200).default(10),

  SMTP_HOST: z.string().min(1).default('127.0.0.1'),
  SMTP_PORT: port.default(1025),
  MAIL_WEB_PORT: port.default(1080),
  MAIL_FROM: z.string().min(3).default('Ingotrace <ingotrace@localhost>'),
});

export type AppConfig = z.infer<typeof configSchema> & { PUBLIC_URL: string };

export class ConfigError extends Error {}

/** Parses the given environment (process.env by default); throws a readable ConfigError. */
export function loadConfig(source: Record<string, string | undefined> = process.env): AppConfig {
  const parsed = configSchema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((issue) => `  ${issue.path.join('.')}: ${issue.message}`);
    throw new ConfigError(`Invalid configuration:\n${lines.join('\n')}`);
  }
  const config = parsed.data;
  return { ...config, PUBLIC_URL: config.PUBLIC_URL ?? `http://${config.HOST}:${config.PORT}` };
}

/** Loads `.env` from the working directory into process.env if the file exists. */
export function loadDotEnv(file = '.env'): void {
  try {
    process.loadEnvFile(file);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'ENOENT') throw error;
  }
}

/** Environment variables for the test profile: every TEST_X overrides X, then test defaults. */
export function testProfileEnvironment(
  source: Record<string, string | undefined> = process.env,
): Record<string, string> {
  const defaults: Record<string, string> = {
    NODE_ENV: 'test',
    DATA_DIR: '.data/test',
    PORT: '8090',
    DB_PORT: '3308',
    DB_NAME: 'ingotrace_test',
    SMTP_PORT: '1026',
    MAIL_WEB_PORT: '1081',
    LOG_LEVEL: 'warn',
  };
  const result: Record<string, string> = {};
  for (const [key, value] of Object.entries(source)) if (value !== undefined) result[key] = value;
  for (const [key, value] of Object.entries(defaults)) result[key] = source[`TEST_${key}`] ?? value;
  return result;
}
