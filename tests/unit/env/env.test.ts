import { describe, expect, it } from 'vitest';
import { parseEnv } from '@/lib/env';

describe('environment parsing', () => {
  it('falls back to loopback defaults so a fresh checkout needs no .env', () => {
    const e = parseEnv({});
    expect(e.DATABASE_URL).toBe('postgres://loadproof@127.0.0.1:54329/loadproof');
    expect(e.S3_ENDPOINT).toBe('http://127.0.0.1:4569');
    expect(e.SMTP_PORT).toBe(2525);
    expect(e.LOADPROOF_LOCAL).toBe(true);
  });

  it('takes real services from variables', () => {
    const e = parseEnv({
      DATABASE_URL: 'postgres://u:p@db.internal:5432/lp', SMTP_PORT: '587', SMTP_SECURE: 'true', LOADPROOF_LOCAL: '0',
      AUTH_SECRET: 'a-long-random-secret-of-our-own', S3_ACCESS_KEY_ID: 'AKIA-REAL', S3_SECRET_ACCESS_KEY: 'real-secret',
    });
    expect(e.DATABASE_URL).toBe('postgres://u:p@db.internal:5432/lp');
    expect(e.SMTP_PORT).toBe(587);
    expect(e.SMTP_SECURE).toBe(true);
    expect(e.LOADPROOF_LOCAL).toBe(false);
  });

  it('is local exactly when the app is served on loopback, unless told', () => {
    expect(parseEnv({ APP_URL: 'http://localhost:3000' }).LOADPROOF_LOCAL).toBe(true);
    const real = { APP_URL: 'https://claims.example.org', AUTH_SECRET: 'a-long-random-secret-of-our-own', S3_ACCESS_KEY_ID: 'K', S3_SECRET_ACCESS_KEY: 'S' };
    expect(parseEnv(real).LOADPROOF_LOCAL).toBe(false);
    expect(parseEnv({ ...real, LOADPROOF_LOCAL: '1' }).LOADPROOF_LOCAL).toBe(true);
  });

  it('outside local mode refuses the well-known local secret and storage keys, naming the variable', () => {
    expect(() => parseEnv({ APP_URL: 'https://claims.example.org', S3_ACCESS_KEY_ID: 'K', S3_SECRET_ACCESS_KEY: 'S' })).toThrow(/AUTH_SECRET/);
    expect(() => parseEnv({ APP_URL: 'https://claims.example.org', AUTH_SECRET: 'a-long-random-secret-of-our-own' })).toThrow(/S3_ACCESS_KEY_ID/);
    expect(() => parseEnv({ LOADPROOF_LOCAL: '0' })).toThrow(/AUTH_SECRET/);
  });

  it('treats an empty variable as unset', () => {
    expect(parseEnv({ S3_BUCKET: '' }).S3_BUCKET).toBe('loadproof-evidence');
  });

  it('refuses a malformed setting with the variable named', () => {
    expect(() => parseEnv({ SMTP_PORT: 'seventy' })).toThrow(/SMTP_PORT/);
    expect(() => parseEnv({ DATABASE_URL: 'not a url' })).toThrow(/DATABASE_URL/);
    expect(() => parseEnv({ S3_BUCKET: 'ab' })).toThrow(/S3_BUCKET/);
  });
});
