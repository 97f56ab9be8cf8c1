import { describe, expect, it } from 'vitest';
import { cookiesSecure, parseEnv, publicUrl } from '../../server/env';

describe('environment', () => {
  it('applies the documented defaults', () => {
    const env = parseEnv({});
    expect(env).toMatchObject({
      HOST: '127.0.0.1',
      PORT: 3000,
      DB_PORT: 3307,
      MAIL_FAKE_PORT: 2525,
      DEMO: true,
      SIGNIN_MAX_FAILURES: 10,
      SIGNIN_WINDOW_MIN: 15,
      SIGNIN_IP_MAX_FAILURES: 100,
      INVITE_TTL_HOURS: 48,
      RESET_TTL_MIN: 60,
      LOG_LEVEL: 'info',
    });
    expect(env.DATABASE_URL).toBeUndefined();
    expect(publicUrl(env)).toBe('http://127.0.0.1:3000');
    expect(cookiesSecure(env)).toBe(false);
  });

  it('treats empty strings as unset and parses DEMO=off', () => {
    const env = parseEnv({ PORT: '', DEMO: 'off' });
    expect(env.PORT).toBe(3000);
    expect(env.DEMO).toBe(false);
  });

  it('names every bad variable', () => {
    expect(() => parseEnv({ PORT: 'eighty', DATABASE_URL: 'postgres://x', SESSION_SECRET: 'short' })).toThrow(
      /PORT.*DATABASE_URL.*SESSION_SECRET|PORT[\s\S]*SESSION_SECRET/,
    );
    expect(() => parseEnv({ DEMO: 'maybe' })).toThrow(/DEMO/);
  });

  it('makes cookies Secure behind a proxy or with an https public URL', () => {
    expect(cookiesSecure(parseEnv({ TRUST_PROXY: '1' }))).toBe(true);
    expect(cookiesSecure(parseEnv({ PUBLIC_URL: 'https://crankwise.example.test' }))).toBe(true);
  });
});
