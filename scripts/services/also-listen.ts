import { createServer, type Server } from "node:net";

// A fake listens on 127.0.0.1 and, for clients on other hosts (EMFOLIO_BIND_ADDRESS), on more
// addresses: a plain TCP listener per address hands each connection to the fake's own server, so
// the same handler, auth and CORS checks answer it. Used by the S3, SMTP and uploadthing fakes.

/** Accepts connections on `host:port` for each host and passes them to `target` (an http or net server). */
export function alsoListen(target: Server, hosts: readonly string[], port: number, log: (line: string) => void): Server[] {
  return hosts.map((host) => {
    const extra = createServer((socket) => target.emit("connection", socket));
    extra.on("error", (err) => {
      console.error(`cannot listen on ${host}:${port}: ${err.message}`);
      process.exit(1);
    });
    extra.listen(port, host, () => log(`also listening on ${host}:${port}`));
    return extra;
  });
}

/** Every `--also-listen HOST` in argv (the flag may repeat). */
export function alsoListenHosts(argv: readonly string[] = process.argv): string[] {
  return argv.flatMap((a, i) => (a === "--also-listen" && argv[i + 1] ? [argv[i + 1] as string] : []));
}
