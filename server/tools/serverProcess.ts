import { spawn, type ChildProcess } from 'node:child_process';
import net from 'node:net';

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as net.AddressInfo;
      srv.close(() => resolve(port));
    });
    srv.on('error', reject);
  });
}

export interface ServerProcess {
  url: string;
  port: number;
  child: ChildProcess;
  output: () => string;
  stop: () => Promise<void>;
}

/**
 * A real Parapet server in its own process: `tsx server/index.ts` by default, or `args` for node
 * (e.g. the compiled `dist-server/index.js`, as start.sh runs it). Waits up to `healthyWithinMs`
 * (or `timeoutMs`) for health.
 */
export async function startServerProcess(env: Record<string, string>, options: number | { args?: string[]; timeoutMs?: number } = {}): Promise<ServerProcess> {
  const opts = typeof options === 'number' ? { timeoutMs: options } : options;
  const port = await freePort();
  let output = '';
  const child = spawn(process.execPath, opts.args ?? ['--import', 'tsx', 'server/index.ts'], {
    env: { ...process.env, NODE_ENV: 'test', HOST: '127.0.0.1', PORT: String(port), ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout!.on('data', (d) => (output += d));
  child.stderr!.on('data', (d) => (output += d));
  const url = `http://127.0.0.1:${port}`;
  // tsx transpiles the whole server at start: on a busy machine that alone can take half a minute.
  const deadline = Date.now() + (opts.timeoutMs ?? 90_000);
  for (;;) {
    if (child.exitCode !== null) throw new Error(`server exited early:\n${output}`);
    try {
      const res = await fetch(`${url}/api/health`);
      if (res.ok) break;
    } catch {
      /* not listening yet */
    }
    if (Date.now() > deadline) throw new Error(`server did not become healthy:\n${output}`);
    await new Promise((r) => setTimeout(r, 200));
  }
  return {
    url,
    port,
    child,
    output: () => output,
    stop: () =>
      new Promise<void>((resolve) => {
        if (child.exitCode !== null) return resolve();
        child.once('exit', () => resolve());
        child.kill('SIGTERM');
        setTimeout(() => child.kill('SIGKILL'), 5000).unref();
      }),
  };
}
