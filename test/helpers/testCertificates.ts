/**
 * A throw-away certificate authority and a server certificate for 127.0.0.1, made with the
 * openssl command, for TLS tests against a real broker.
 */
import { execFileSync } from 'node:child_process';
import { chmodSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

export interface TestCertificates {
  caFile: string;
  certFile: string;
  keyFile: string;
}

/** Writes ca.pem, server.pem and server.key into `dir` (world-readable: the broker drops root). */
export function makeTestCertificates(dir: string): TestCertificates {
  const file = (name: string) => join(dir, name);
  const openssl = (...args: string[]) =>
    execFileSync('/usr/bin/openssl', args, { stdio: 'ignore' });
  openssl(
    'req',
    '-x509',
    '-newkey',
    'rsa:2048',
    '-nodes',
    '-keyout',
    file('ca.key'),
    '-out',
    file('ca.pem'),
    '-days',
    '2',
    '-subj',
    '/CN=meniscus test CA',
  );
  openssl(
    'req',
    '-newkey',
    'rsa:2048',
    '-nodes',
    '-keyout',
    file('server.key'),
    '-out',
    file('server.csr'),
    '-subj',
    '/CN=127.0.0.1',
  );
  writeFileSync(file('san.cnf'), 'subjectAltName=IP:127.0.0.1\n');
  openssl(
    'x509',
    '-req',
    '-in',
    file('server.csr'),
    '-CA',
    file('ca.pem'),
    '-CAkey',
    file('ca.key'),
    '-CAcreateserial',
    '-out',
    file('server.pem'),
    '-days',
    '2',
    '-extfile',
    file('san.cnf'),
  );
  for (const name of ['ca.pem', 'server.pem', 'server.key']) chmodSync(file(name), 0o644);
  return { caFile: file('ca.pem'), certFile: file('server.pem'), keyFile: file('server.key') };
}
