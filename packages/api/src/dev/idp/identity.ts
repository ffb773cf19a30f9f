/**
 * The local fake identity provider's signing key and self-signed certificate.
 * Generated on first start into <devFakes.dataDir>/idp/identity.json
 * (git-ignored .data/), never committed. Several processes may start at once
 * (the fakes, the API, parallel test files): the file is created atomically
 * (write a temporary file, then link it into place, which fails if another
 * process got there first) and always read back, so all agree on one key.
 */
import { randomBytes } from 'node:crypto';
import { existsSync, linkSync, mkdirSync, readFileSync, unlinkSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import selfsigned from 'selfsigned';

export interface SigningIdentity {
  privateKey: string;
  cert: string;
}

export function identityFile(dataDir: string): string {
  return join(dataDir, 'idp', 'identity.json');
}

/** A fresh RSA-2048 key and a self-signed SHA-256 certificate valid for ten years. */
export async function generateSigningIdentity(commonName: string): Promise<SigningIdentity> {
  const now = new Date();
  const pems = await selfsigned.generate([{ name: 'commonName', value: commonName }], {
    keySize: 2048,
    algorithm: 'sha256',
    notBeforeDate: new Date(now.getTime() - 24 * 3600_000),
    notAfterDate: new Date(now.getTime() + 10 * 365 * 24 * 3600_000),
  });
  return { privateKey: pems.private, cert: pems.cert };
}

function read(file: string): SigningIdentity {
  const parsed = JSON.parse(readFileSync(file, 'utf8')) as Partial<SigningIdentity>;
  if (typeof parsed.privateKey !== 'string' || typeof parsed.cert !== 'string') {
    throw new Error(`${file} is not a fake identity provider key file; delete it to regenerate`);
  }
  return { privateKey: parsed.privateKey, cert: parsed.cert };
}

/** Reads the fake IdP's key and certificate, generating them on first use. */
export async function ensureSigningIdentity(dataDir: string): Promise<SigningIdentity> {
  const file = identityFile(dataDir);
  if (existsSync(file)) return read(file);
  mkdirSync(join(dataDir, 'idp'), { recursive: true });
  const identity = await generateSigningIdentity(
    'Cairn local identity provider (development only)',
  );
  const temp = `${file}.${process.pid}.${randomBytes(4).toString('hex')}`;
  writeFileSync(temp, JSON.stringify(identity, null, 2) + '\n', { mode: 0o600 });
  try {
    linkSync(temp, file);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'EEXIST') throw error;
  } finally {
    unlinkSync(temp);
  }
  return read(file);
}
