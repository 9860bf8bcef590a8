import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig, testProfileEnvironment } from '../../../server/src/config/env';

describe('loadConfig', () => {
  it('when nothing is set, then every setting has its local default', () => {
    const config = loadConfig({});
    expect(config).toMatchObject({ HOST: '127.0.0.1', PORT: 8080, DB_PORT: 3307, DB_NAME: 'ingotrace', SMTP_PORT: 1025, MAIL_WEB_PORT: 1080 });
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

describe('testProfileEnvironment', () => {
  it('when building the test profile, then it moves every port and the database away from the development ones', () => {
    const env = testProfileEnvironment({ DB_PORT: '3307', PORT: '8080', UNRELATED: 'kept' });
    expect(env).toMatchObject({ NODE_ENV: 'test', DB_PORT: '3308', PORT: '8090', DB_NAME: 'ingotrace_test', DATA_DIR: '.data/test', UNRELATED: 'kept' });
  });

  it('when TEST_ settings are given, then they win', () => {
    expect(testProfileEnvironment({ TEST_DB_PORT: '4400', TEST_PORT: '9000' })).toMatchObject({ DB_PORT: '4400', PORT: '9000' });
  });
});
