import net from 'node:net';

export type ProxyMode = 'pass' | 'refuse' | 'hang';

/**
 * A loopback TCP proxy tests put between Parapet and PostgreSQL or SMTP to make them go away:
 * `refuse` cuts every open connection and refuses new ones, `hang` accepts and never answers
 * (a wedged server), `pass` forwards to the target again.
 */
export async function startTcpProxy(targetPort: number, targetHost = '127.0.0.1') {
  let mode: ProxyMode = 'pass';
  const open = new Set<net.Socket>();
  const server = net.createServer((client) => {
    open.add(client);
    client.on('close', () => open.delete(client));
    client.on('error', () => client.destroy());
    if (mode === 'refuse') return client.destroy();
    if (mode === 'hang') return; // keep it open and say nothing
    const upstream = net.connect(targetPort, targetHost);
    open.add(upstream);
    upstream.on('close', () => {
      open.delete(upstream);
      client.destroy();
    });
    upstream.on('error', () => upstream.destroy());
    client.on('close', () => upstream.destroy());
    client.pipe(upstream).pipe(client);
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const port = (server.address() as net.AddressInfo).port;
  return {
    port,
    get mode() {
      return mode;
    },
    /** Switching mode drops every connection made so far, as a restart or a cut cable would. */
    set(next: ProxyMode) {
      mode = next;
      for (const s of open) s.destroy();
      open.clear();
    },
    close: () =>
      new Promise<void>((resolve) => {
        for (const s of open) s.destroy();
        server.close(() => resolve());
      }),
  };
}
