// Serving HTTPS directly (issue 20 item 1): the browser only lets a page record from the
// microphone or an audio interface in a secure context — https://, or http://127.0.0.1 and
// localhost — so a shop tablet that reaches the server at a LAN address needs TLS, either here
// (TLS_CERT_FILE + TLS_KEY_FILE) or from a reverse proxy in front (TRUST_PROXY; README).
import { readFileSync } from 'node:fs';
import { createServer as createHttpsServer } from 'node:https';
import { createServer as createHttpServer, type RequestListener, type Server } from 'node:http';
import type { Env } from './env';

/** The certificate and key read from TLS_CERT_FILE / TLS_KEY_FILE, or null when TLS is not configured. */
export function readTlsFiles(env: Pick<Env, 'TLS_CERT_FILE' | 'TLS_KEY_FILE'>): { cert: Buffer; key: Buffer } | null {
  if (!env.TLS_CERT_FILE || !env.TLS_KEY_FILE) return null;
  const read = (variable: string, path: string, what: string): Buffer => {
    let data: Buffer;
    try { data = readFileSync(path); } catch (e) {
      const code = (e as NodeJS.ErrnoException).code;
      const why = code === 'ENOENT' ? 'no such file' : code === 'EACCES' ? 'permission denied' : code === 'EISDIR' ? 'is a folder' : String((e as Error).message);
      throw new Error(`${variable}: cannot read ${path} (${why}); give the path of the ${what} in PEM form`);
    }
    if (!data.toString('latin1').includes('-----BEGIN')) throw new Error(`${variable}: ${path} is not PEM (no "-----BEGIN" line); give the ${what} in PEM form`);
    return data;
  };
  return { cert: read('TLS_CERT_FILE', env.TLS_CERT_FILE, 'certificate (chain)'), key: read('TLS_KEY_FILE', env.TLS_KEY_FILE, 'private key') };
}

/**
 * Listens on HOST:PORT with the app: HTTPS when TLS files are configured, else HTTP. Resolves
 * with the server and its scheme once listening; rejects on a listen error (e.g. the port in use)
 * or on a certificate and key that do not go together.
 */
export function listenApp(app: RequestListener, env: Pick<Env, 'HOST' | 'PORT' | 'TLS_CERT_FILE' | 'TLS_KEY_FILE'>): Promise<{ server: Server; scheme: 'http' | 'https' }> {
  const tls = readTlsFiles(env);
  return new Promise((resolve, reject) => {
    let server: Server;
    try {
      server = tls ? (createHttpsServer(tls, app) as unknown as Server) : createHttpServer(app);
    } catch (e) {
      reject(new Error(`TLS_CERT_FILE / TLS_KEY_FILE: ${(e as Error).message}; check that the key belongs to the certificate`));
      return;
    }
    server.once('error', reject);
    server.listen(env.PORT, env.HOST, () => resolve({ server, scheme: tls ? 'https' : 'http' }));
  });
}
