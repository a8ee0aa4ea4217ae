import net from "node:net";

/**
 * A camp's poor link on loopback: a TCP proxy in front of the app whose two directions are
 * each one shared link of a given rate (a token bucket: bytes leave at `upBps`/`downBps`) and
 * one-way delay (half the round trip). Every connection shares the same link, as a camp's
 * devices share one satellite modem. Reading from a sender pauses while its link holds more
 * than a small buffer, so the browser sees the real pace, not an instant upload into a queue.
 * `cut()` drops every open connection, as a link that goes away does.
 */
export type ShapedLink = {
  port: number;
  /** Client-to-server payload bytes taken from senders, and server-to-client. */
  bytes: { up: number; down: number };
  shaping: boolean;
  /** Drops every connection; new ones are refused for `outageMs`. */
  cut(outageMs?: number): void;
  /** Calls `fn` once when the up count first passes `atUpBytes`. */
  onUpBytes(atUpBytes: number, fn: () => void): void;
  close(): Promise<void>;
};

const PIECE = 4096;
const BUFFER = 32 * 1024;

type Direction = { bps: number; freeAt: number };

export async function startShapedLink(opts: { targetPort: number; upBps: number; downBps: number; rttMs: number }): Promise<ShapedLink> {
  const up: Direction = { bps: opts.upBps, freeAt: 0 };
  const down: Direction = { bps: opts.downBps, freeAt: 0 };
  const oneWay = opts.rttMs / 2;
  const sockets = new Set<net.Socket>();
  const watchers: { at: number; fn: () => void }[] = [];
  let refuseUntil = 0;

  const link: ShapedLink = {
    port: 0,
    bytes: { up: 0, down: 0 },
    shaping: true,
    cut(outageMs = 0) {
      refuseUntil = Date.now() + outageMs;
      for (const s of sockets) s.destroy();
      sockets.clear();
    },
    onUpBytes(at, fn) {
      watchers.push({ at, fn });
    },
    close: () =>
      new Promise<void>((resolve) => {
        link.cut();
        server.close(() => resolve());
      }),
  };

  /** Carries `from`'s bytes to `to` over one direction of the link. */
  const carry = (from: net.Socket, to: net.Socket, dir: Direction, count: (n: number) => void) => {
    let queued = 0;
    from.on("data", (data: Buffer) => {
      count(data.length);
      if (!link.shaping) {
        to.write(data);
        return;
      }
      for (let o = 0; o < data.length; o += PIECE) {
        const piece = data.subarray(o, o + PIECE);
        const now = Date.now();
        dir.freeAt = Math.max(dir.freeAt, now) + (piece.length * 8 * 1000) / dir.bps;
        queued += piece.length;
        setTimeout(
          () => {
            queued -= piece.length;
            if (!to.destroyed) to.write(piece);
            if (queued < BUFFER && from.isPaused()) from.resume();
          },
          dir.freeAt - now + oneWay,
        );
      }
      if (queued >= BUFFER) from.pause();
    });
    from.on("end", () => {
      const wait = link.shaping ? Math.max(0, dir.freeAt - Date.now()) + oneWay : 0;
      setTimeout(() => to.end(), wait);
    });
  };

  const server = net.createServer((client) => {
    if (Date.now() < refuseUntil) return client.destroy();
    const upstream = net.connect(opts.targetPort, "127.0.0.1");
    sockets.add(client);
    sockets.add(upstream);
    const drop = () => {
      client.destroy();
      upstream.destroy();
      sockets.delete(client);
      sockets.delete(upstream);
    };
    client.on("error", drop);
    upstream.on("error", drop);
    client.on("close", drop);
    upstream.on("close", drop);
    carry(client, upstream, up, (n) => {
      link.bytes.up += n;
      for (const w of watchers.splice(0)) {
        if (link.bytes.up >= w.at) w.fn();
        else watchers.push(w);
      }
    });
    carry(upstream, client, down, (n) => (link.bytes.down += n));
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  link.port = (server.address() as net.AddressInfo).port;
  return link;
}
