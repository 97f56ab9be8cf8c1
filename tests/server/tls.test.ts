import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { request } from 'node:https';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { cookiesSecure, parseEnv } from '../../server/env';
import { listenApp, readTlsFiles } from '../../server/tls';

// Serving HTTPS directly (issue 20 item 1: recording needs a secure page on a LAN address). A
// throwaway self-signed certificate for 127.0.0.1 is made with the system's openssl in a temporary
// folder; the client trusts exactly that certificate, so the check is real TLS, not "insecure".
const dir = mkdtempSync(join(tmpdir(), 'crankwise-tls-'));
const cert = join(dir, 'cert.pem');
const key = join(dir, 'key.pem');
const otherKey = join(dir, 'other-key.pem');
const openssl = (args: string[]) => execFileSync('openssl', args, { stdio: 'pipe' });
openssl(['req', '-x509', '-newkey', 'rsa:2048', '-nodes', '-keyout', key, '-out', cert, '-days', '1', '-subj', '/CN=127.0.0.1', '-addext', 'subjectAltName=IP:127.0.0.1']);
openssl(['genpkey', '-algorithm', 'RSA', '-pkeyopt', 'rsa_keygen_bits:2048', '-out', otherKey]);
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('serving TLS from TLS_CERT_FILE and TLS_KEY_FILE', () => {
  it('answers over HTTPS with the configured certificate', async () => {
    const { server, scheme } = await listenApp((_req, res) => { res.end('ok'); }, { HOST: '127.0.0.1', PORT: 0, TLS_CERT_FILE: cert, TLS_KEY_FILE: key });
    try {
      expect(scheme).toBe('https');
      const { port } = server.address() as AddressInfo;
      const tls = readTlsFiles({ TLS_CERT_FILE: cert, TLS_KEY_FILE: key })!;
      const body = await new Promise<{ text: string; authorized: boolean }>((resolve, reject) => {
        const req = request({ host: '127.0.0.1', port, path: '/', ca: tls.cert, agent: false }, (res) => {
          const authorized = (res.socket as unknown as { authorized: boolean }).authorized;
          let text = '';
          res.on('data', (c) => { text += c; });
          res.on('end', () => resolve({ text, authorized }));
        });
        req.on('error', reject);
        req.end();
      });
      expect(body.text).toBe('ok');
      expect(body.authorized).toBe(true);
    } finally {
      await new Promise((r) => server.close(r));
    }
  });

  it('serves plain HTTP when no TLS files are set', async () => {
    const { server, scheme } = await listenApp((_req, res) => { res.end('ok'); }, { HOST: '127.0.0.1', PORT: 0 });
    expect(scheme).toBe('http');
    await new Promise((r) => server.close(r));
  });

  it('says which file cannot be read and what to give', () => {
    expect(() => readTlsFiles({ TLS_CERT_FILE: join(dir, 'missing.pem'), TLS_KEY_FILE: key })).toThrow(/TLS_CERT_FILE: cannot read .*missing\.pem \(no such file\); give the path of the certificate/);
    const notPem = join(dir, 'not.pem');
    writeFileSync(notPem, 'hello');
    expect(() => readTlsFiles({ TLS_CERT_FILE: cert, TLS_KEY_FILE: notPem })).toThrow(/TLS_KEY_FILE: .* is not PEM/);
  });

  it('refuses a key that does not belong to the certificate', async () => {
    await expect(listenApp((_req, res) => { res.end(); }, { HOST: '127.0.0.1', PORT: 0, TLS_CERT_FILE: cert, TLS_KEY_FILE: otherKey }))
      .rejects.toThrow(/check that the key belongs to the certificate/);
  });

  it('needs both variables, and makes cookies Secure when set', () => {
    expect(() => parseEnv({ TLS_CERT_FILE: cert })).toThrow(/TLS_KEY_FILE: set TLS_CERT_FILE and TLS_KEY_FILE together/);
    expect(cookiesSecure(parseEnv({ TLS_CERT_FILE: cert, TLS_KEY_FILE: key }))).toBe(true);
    expect(cookiesSecure(parseEnv({}))).toBe(false);
  });
});
