import net from 'node:net';

/**
 * A tiny TCP forwarder that a test can cut and restore, standing in for a database
 * that goes away: closing it refuses new connections and drops the open ones.
 */
export class TcpProxy {
  private server: net.Server | null = null;
  private readonly sockets = new Set<net.Socket>();
  port = 0;

  constructor(
    private readonly targetHost: string,
    private readonly targetPort: number,
  ) {}

  /** Listens (on the same port as before after a close, so clients find it again). */
  async open(): Promise<number> {
    const server = net.createServer((client) => this.forward(client));
    await new Promise<void>((resolve, reject) => {
      server.once('error', reject);
      server.listen(this.port, '127.0.0.1', () => resolve());
    });
    this.server = server;
    this.port = (server.address() as net.AddressInfo).port;
    return this.port;
  }

  /** Stops listening and destroys every forwarded connection, like a database that stopped. */
  async close(): Promise<void> {
    const server = this.server;
    this.server = null;
    for (const socket of this.sockets) socket.destroy();
    this.sockets.clear();
    if (server) await new Promise<void>((resolve) => server.close(() => resolve()));
  }

  private forward(client: net.Socket): void {
    const upstream = net.connect(this.targetPort, this.targetHost);
    for (const [a, b] of [
      [client, upstream],
      [upstream, client],
    ] as const) {
      this.sockets.add(a);
      a.pipe(b);
      // Either side failing or ending ends the pair; errors here are the point of the proxy, not failures.
      a.on('error', () => b.destroy());
      a.on('close', () => {
        this.sockets.delete(a);
        b.destroy();
      });
    }
  }
}
