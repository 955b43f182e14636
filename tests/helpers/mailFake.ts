import { spawn } from 'node:child_process';
import net from 'node:net';
import path from 'node:path';

// The SMTP fake (maildev) the tests read through its REST API (MAILDEV_WEB_URL).
export interface FakeMail {
  id: string;
  subject: string;
  to: { address: string; name: string }[];
  headers: Record<string, string>;
  text: string;
  html: string;
}

const webUrl = (base = process.env.MAILDEV_WEB_URL) => {
  if (!base) throw new Error('MAILDEV_WEB_URL must point at the mail fake (docker-free-scripts/test.sh starts one).');
  return base.replace(/\/$/, '');
};

export async function inbox(base?: string): Promise<FakeMail[]> {
  const res = await fetch(`${webUrl(base)}/api/email`);
  if (!res.ok) throw new Error(`the mail fake answered ${res.status}`);
  return (await res.json()) as FakeMail[];
}

/** Mail whose recipient is one of `addresses` (other tests' mail is ignored). */
export async function mailTo(addresses: string[], base?: string) {
  const wanted = new Set(addresses.map((a) => a.toLowerCase()));
  return (await inbox(base)).filter((m) => m.to.some((t) => wanted.has(t.address.toLowerCase())));
}

/** The raw message as received, headers included. */
export async function rawSource(id: string, base?: string) {
  return (await fetch(`${webUrl(base)}/api/email/${id}/source`)).text();
}

/** The header block as received, folded lines joined (RFC 5322 §2.2.3), one header per line. */
export async function rawHeaders(id: string, base?: string) {
  const source = await rawSource(id, base);
  return source.split(/\r?\n\r?\n/)[0].replace(/\r?\n[ \t]+/g, ' ');
}

export async function clearInbox(base?: string) {
  await fetch(`${webUrl(base)}/api/email/all`, { method: 'DELETE' });
}

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as net.AddressInfo;
      srv.close(() => resolve(port));
    });
  });
}

/** Starts a maildev of its own on the given SMTP port; resolves when its API answers. */
export async function startMaildev(smtpPort: number, webPort: number) {
  const bin = path.resolve('node_modules/.bin/maildev');
  const child = spawn(bin, ['--ip', '127.0.0.1', '--smtp', String(smtpPort), '--web', String(webPort)], { stdio: 'ignore' });
  const base = `http://127.0.0.1:${webPort}`;
  for (let i = 0; i < 100; i++) {
    try {
      if ((await fetch(`${base}/api/healthz`)).ok) break;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  return {
    base,
    stop: () =>
      new Promise<void>((resolve) => {
        child.once('exit', () => resolve());
        child.kill('SIGTERM');
      }),
  };
}
