import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig, testProfileEnvironment } from '../../../server/src/config/env';

describe('loadConfig', () => {
  it('when nothing is set, then every setting has its local default', () => {
    const config = loadConfig({});
    expect(config).toMatchObject({
      HOST: '127.0.0.1',
      PORT: 8080,
      DB_PORT: 3307,
      DB_NAME: 'ingotrace',
      SMTP_PORT: 1025,
      MAIL_WEB_PORT: 1080,
    });
    expect(config.PUBLIC_URL).toBe('http://127.0.0.1:8080');
  });

  it('when values are wrong, then one ConfigError names every bad setting', () => {
    expect(() => loadConfig({ PORT: '99999', DB_NAME: 'drop;table', PUBLIC_URL: 'not a url' })).toThrow(ConfigError);
    try {
      loadConfig({ PORT: '99999', DB_NAME: 'drop;table', PUBLIC_URL: 'not a url' });
    } catch (error) {
      const message = (error as Error).message;
      expect(message).toMatch(/PORT:/);
      expect(message).toMatch(/DB_NAME: letters, digits and underscores only/);
      expect(message).toMatch(/PUBLIC_URL:/);
    }
  });
});

describe('secrets and proxies', () => {
  const own = {
    SESSION_SECRET: 'a-long-secret-of-our-own',
    DB_PASSWORD: 'app-password-1',
    DB_MIGRATION_PASSWORD: 'owner-password-1',
  };

  it(
    '[CONFIG-EXAMPLE-SECRETS] when the app is served over https with any example secret, then it refuses to ' +
      'start and names each one',
    () => {
      expect(() => loadConfig({ PUBLIC_URL: 'https://ingotrace.example.internal' })).toThrow(
        /SESSION_SECRET: still the example value[\s\S]*DB_PASSWORD[\s\S]*DB_MIGRATION_PASSWORD/,
      );
      expect(() =>
        loadConfig({ PUBLIC_URL: 'https://ingotrace.example.internal', ...own, DB_PASSWORD: 'local-app-password' }),
      ).toThrow(
        /^Invalid configuration:\n {2}DB_PASSWORD: still the example value; set your own before serving https:\/\/ingotrace.example.internal$/,
      );
      expect(loadConfig({ PUBLIC_URL: 'https://ingotrace.example.internal', ...own }).PUBLIC_URL).toBe(
        'https://ingotrace.example.internal',
      );
      // Locally over http the example values are what the scripts set up.
      expect(loadConfig({}).SESSION_SECRET).toBe('local-session-secret-change-me');
    },
  );

  it('when TRUST_PROXY is not set, then no proxy is believed', () => {
    expect(loadConfig({}).TRUST_PROXY).toBeUndefined();
    expect(loadConfig({ TRUST_PROXY: 'loopback' }).TRUST_PROXY).toBe('loopback');
  });
});

describe('testProfileEnvironment', () => {
  it('when building the test profile, then it moves every port and the database away from the development ones', () => {
    const env = testProfileEnvironment({ DB_PORT: '3307', PORT: '8080', UNRELATED: 'kept' });
    expect(env).toMatchObject({
      NODE_ENV: 'test',
      DB_PORT: '3308',
      PORT: '8090',
      DB_NAME: 'ingotrace_test',
      DATA_DIR: '.data/test',
      UNRELATED: 'kept',
    });
  });

  it('when TEST_ settings are given, then they win', () => {
    expect(testProfileEnvironment({ TEST_DB_PORT: '4400', TEST_PORT: '9000' })).toMatchObject({
      DB_PORT: '4400',
      PORT: '9000',
    });
  });
});
