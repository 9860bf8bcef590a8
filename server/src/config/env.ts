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
  // Processes serving the app on this machine (node:cluster); one per core serves the most.
  APP_WORKERS: z.coerce.number().int().min(1).max(64).default(1),
  PUBLIC_URL: z.url().optional(),
  // Proxies whose X-Forwarded-For the app believes (Express "trust proxy": loopback, a subnet
  // such as 10.0.0.0/8, or addresses, comma-separated); sign-in limits count per client address.
  // Unset, no proxy is believed: a local process cannot choose the address a limit counts.
  TRUST_PROXY: z.string().trim().optional(),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),

  DATA_DIR: z.string().min(1).default('.data/dev'),
  // local: npm start runs, migrates and seeds its own MariaDB. external: the database at
  // DB_HOST:DB_PORT is run by someone else (a Galera cluster behind a load balancer, say), who
  // also migrates it and gives the app account its grants (npm run cluster:start does both).
  DB_SERVER: z.enum(['local', 'external']).default('local'),
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
  // Where the audit ledger's checkpoints are mailed (a witness outside the database): the quality mailbox.
  QUALITY_MAILBOX: z
    .string()
    .trim()
    .regex(/^[^\s@<>]+@[^\s@<>]+$/, 'an e-mail address')
    .default('quality-records@localhost'),
  // The Ed25519 key that signs every audit ledger event; readable only by the app's user. Created
  // at first use under DATA_DIR/keys unless set (a firm may keep it elsewhere, see the README).
  LEDGER_KEY_FILE: z.string().min(1).optional(),

  // Sign-in through SAML 2.0. The defaults point at the local stand-in identity provider that
  // npm start runs; production sets the firm's identity provider here.
  IDP_PORT: port.default(7000),
  IDP_ALLOWED_ACS_URLS: z.string().optional(),
  SAML_IDP_SSO_URL: z.url().optional(),
  SAML_IDP_SLO_URL: z.url().optional(),
  SAML_IDP_ENTITY_ID: z.string().min(1).optional(),
  SAML_IDP_CERT_FILE: z.string().min(1).optional(),
  SAML_SP_ENTITY_ID: z.string().min(1).default('urn:ingotrace:service-provider'),
  SAML_CLOCK_SKEW_MS: z.coerce.number().int().min(0).max(300_000).default(5_000),
  SAML_GROUP_ATTRIBUTE: z.string().min(1).default('groups'),
  SAML_ROLE_MAP: z.string().optional(),
  // Saw kerf allowed per cut when a bar piece is cut into child pieces, in mm.
  BAR_KERF_ALLOWANCE_MM: z
    .string()
    .regex(/^\d+(\.\d+)?$/, 'a length in mm such as 3')
    .default('3'),
  SESSION_SECRET: z.string().min(16).default('local-session-secret-change-me'),
  SESSION_IDLE_MINUTES: z.coerce
    .number()
    .min(0.05)
    .max(24 * 60)
    .default(15),
  SESSION_ABSOLUTE_HOURS: z.coerce.number().min(1).max(72).default(12),
  // Sign-in attempts per client address, and signatures (with their password prompts) per person, in any 15 minutes.
  SIGN_IN_ATTEMPTS_PER_15_MIN: z.coerce.number().int().min(1).max(1_000_000).default(30),
  SIGNING_ATTEMPTS_PER_15_MIN: z.coerce.number().int().min(1).max(1_000_000).default(60),
});

const defaultRoleMap: Record<string, string> = {
  'ingotrace-manufacturing-engineers': 'manufacturing-engineer',
  'ingotrace-qa-reviewers': 'qa-reviewer',
  'ingotrace-qa-approvers': 'qa-approver',
  'ingotrace-auditors': 'auditor',
  'ingotrace-recall-coordinators': 'recall-coordinator',
  'ingotrace-administrators': 'administrator',
};

const roleMapSchema = z.record(z.string().min(1), z.string().min(1));

type ParsedConfig = z.infer<typeof configSchema>;

export type AppConfig = ParsedConfig & {
  PUBLIC_URL: string;
  SAML_IDP_SSO_URL: string;
  SAML_IDP_SLO_URL: string;
  SAML_IDP_ENTITY_ID: string;
  SAML_IDP_CERT_FILE: string;
  /** Identity-provider group → Ingotrace role name (checked against the role list at boot). */
  roleMap: Record<string, string>;
  /** Where the stand-in identity provider may send responses. */
  allowedAcsUrls: string[];
};

export class ConfigError extends Error {}

/** Parses the given environment (process.env by default); throws a readable ConfigError. */
export function loadConfig(source: Record<string, string | undefined> = process.env): AppConfig {
  const parsed = configSchema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((issue) => `  ${issue.path.join('.')}: ${issue.message}`);
    throw new ConfigError(`Invalid configuration:\n${lines.join('\n')}`);
  }
  const config = parsed.data;
  const publicUrl = (config.PUBLIC_URL ?? `http://${config.HOST}:${config.PORT}`).replace(/\/$/, '');
  const exampleSecrets = (['SESSION_SECRET', 'DB_PASSWORD', 'DB_MIGRATION_PASSWORD'] as const).filter(
    (key) => config[key] === configSchema.shape[key].parse(undefined),
  );
  if (publicUrl.startsWith('https:') && exampleSecrets.length) {
    const lines = exampleSecrets.map(
      (key) => `  ${key}: still the example value; set your own before serving ${publicUrl}`,
    );
    throw new ConfigError(`Invalid configuration:\n${lines.join('\n')}`);
  }
  const idpBase = `http://127.0.0.1:${config.IDP_PORT}`;
  let roleMap = defaultRoleMap;
  if (config.SAML_ROLE_MAP) {
    let candidate: unknown;
    try {
      candidate = JSON.parse(config.SAML_ROLE_MAP);
    } catch {
      throw new ConfigError('Invalid configuration:\n  SAML_ROLE_MAP: must be a JSON object of group name to role');
    }
    const map = roleMapSchema.safeParse(candidate);
    if (!map.success)
      throw new ConfigError('Invalid configuration:\n  SAML_ROLE_MAP: must be a JSON object of group name to role');
    roleMap = map.data;
  }
  const ownAcs = [`${publicUrl}/auth/saml/acs`, `${publicUrl}/auth/saml/reauth-acs`];
  const extraAcs = (config.IDP_ALLOWED_ACS_URLS ?? '')
    .split(',')
    .map((url) => url.trim())
    .filter(Boolean);
  return {
    ...config,
    PUBLIC_URL: publicUrl,
    SAML_IDP_SSO_URL: config.SAML_IDP_SSO_URL ?? `${idpBase}/sso`,
    SAML_IDP_SLO_URL: config.SAML_IDP_SLO_URL ?? `${idpBase}/slo`,
    SAML_IDP_ENTITY_ID: config.SAML_IDP_ENTITY_ID ?? `${idpBase}/metadata`,
    SAML_IDP_CERT_FILE: config.SAML_IDP_CERT_FILE ?? `${config.DATA_DIR}/identity-provider/signing-cert.pem`,
    roleMap,
    allowedAcsUrls: [...ownAcs, ...extraAcs],
  };
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
    IDP_PORT: '7010',
    LOG_LEVEL: 'warn',
    // Not the example values: the suites also run the app as if served over https, which refuses those.
    SESSION_SECRET: 'test-profile-session-secret',
    DB_PASSWORD: 'test-profile-app-password',
    DB_MIGRATION_PASSWORD: 'test-profile-migration-password',
    // The suites sign in hundreds of times from one address; the limits have their own test.
    SIGN_IN_ATTEMPTS_PER_15_MIN: '100000',
    SIGNING_ATTEMPTS_PER_15_MIN: '100000',
  };
  const result: Record<string, string> = {};
  for (const [key, value] of Object.entries(source)) if (value !== undefined) result[key] = value;
  for (const [key, value] of Object.entries(defaults)) result[key] = source[`TEST_${key}`] ?? value;
  return result;
}
