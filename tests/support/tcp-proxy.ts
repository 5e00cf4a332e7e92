import { createConnection, createServer, type Server, type Socket } from "node:net";

// A loopback TCP relay in front of one service, so a test can take that service away from one
// process (the worker) and give it back, while everything else still reaches it directly.

export type TcpProxy = { port: number; url: (original: string) => string; cut: () => Promise<void>; restore: () => Promise<void>; close: () => Promise<void> };

export async function startTcpProxy(targetPort: number, targetHost = "127.0.0.1"): Promise<TcpProxy> {
  const sockets = new Set<Socket>();
  let server: Server | null = null;
  let port = 0;
  const listen = () =>
    new Promise<void>((resolve, reject) => {
      const s = createServer((client) => {
        const upstream = createConnection({ host: targetHost, port: targetPort });
        for (const socket of [client, upstream]) {
          sockets.add(socket);
          socket.on("close", () => sockets.delete(socket));
          socket.on("error", () => socket.destroy());
        }
        client.pipe(upstream).pipe(client);
        client.on("close", () => upstream.destroy());
        upstream.on("close", () => client.destroy());
      });
      s.once("error", reject);
      s.listen(port, "127.0.0.1", () => {
        const address = s.address();
        if (address && typeof address === "object") port = address.port;
        server = s;
        resolve();
      });
    });
  const stop = () =>
    new Promise<void>((resolve) => {
      for (const socket of sockets) socket.destroy();
      sockets.clear();
      if (!server) return resolve();
      server.close(() => resolve());
      server = null;
    });
  await listen();
  return {
    port,
    url: (original) => {
      const u = new URL(original);
      u.hostname = "127.0.0.1";
      u.port = String(port);
      return u.toString().replace(/\/$/, original.endsWith("/") ? "/" : "");
    },
    // Connections drop and new ones are refused, as when the service stops.
    cut: stop,
    restore: listen,
    close: stop,
  };
}
