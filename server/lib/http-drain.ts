/**
 * Stopping an HTTP server without resetting a request it has already received.
 *
 * Node's `http.Server#close()` (Node ≥ 19) destroys every keep-alive connection that looks
 * idle at that instant. A pooled client sends its next request the moment it has read an
 * answer, so "idle" often means "the next request is in the socket buffer, not parsed yet";
 * destroying such a socket resets that request. Here the drain instead:
 *
 * 1. stops accepting connections (`net.Server#close`, which leaves open connections alone);
 * 2. answers every request received, with `Connection: close` on each answer whose headers
 *    are not sent yet, so the client sends nothing more on that connection;
 * 3. closes a connection with nothing in flight once it has been quiet for `idleGraceMs`, by
 *    ending it (FIN) rather than destroying it: a request already on its way is read and
 *    answered first, and the client sees an orderly close, not a reset.
 */
import type { IncomingMessage, Server, ServerResponse } from "node:http";
import net, { type Socket } from "node:net";

export interface DrainOptions {
  /** How long a connection with no request in flight stays open during the drain (ms). */
  idleGraceMs?: number;
}

export interface HttpDrain {
  /** Starts the drain; resolves once every connection is closed. Calling it again returns the same promise. */
  drain(): Promise<void>;
  /** Destroys every connection still open (past the deadline); returns how many requests were cut. */
  destroyAll(): number;
  /** Open connections and requests in flight (for the log). */
  stats(): { connections: number; requests: number };
}

/** Tracks the server's connections from now on; call before `listen`. */
export function httpDrain(server: Server, options: DrainOptions = {}): HttpDrain {
  const idleGraceMs = options.idleGraceMs ?? 1_000;
  const inFlight = new Map<Socket, Set<ServerResponse>>();
  const quietTimers = new Map<Socket, NodeJS.Timeout>();
  let draining: Promise<void> | undefined;
  let drained: () => void = () => undefined;

  const settle = () => {
    if (draining && inFlight.size === 0) drained();
  };

  const closeWhenQuiet = (socket: Socket) => {
    clearTimeout(quietTimers.get(socket));
    if (socket.destroyed) return;
    quietTimers.set(
      socket,
      setTimeout(() => {
        quietTimers.delete(socket);
        if ((inFlight.get(socket)?.size ?? 0) > 0) return;
        socket.end();
        // A client that never closes its side is let go after another grace period.
        setTimeout(() => {
          if ((inFlight.get(socket)?.size ?? 0) === 0) socket.destroy();
        }, idleGraceMs).unref();
      }, idleGraceMs),
    );
  };

  server.on("connection", (socket: Socket) => {
    inFlight.set(socket, new Set());
    socket.once("close", () => {
      clearTimeout(quietTimers.get(socket));
      quietTimers.delete(socket);
      inFlight.delete(socket);
      settle();
    });
    if (draining) closeWhenQuiet(socket);
  });

  // Before the app's own listener, so the header is in place before any handler could answer.
  server.prependListener("request", (req: IncomingMessage, res: ServerResponse) => {
    const socket = req.socket;
    let responses = inFlight.get(socket);
    if (!responses) inFlight.set(socket, (responses = new Set()));
    responses.add(res);
    clearTimeout(quietTimers.get(socket));
    quietTimers.delete(socket);
    if (draining) res.setHeader("Connection", "close");
    res.once("close", () => {
      responses.delete(res);
      if (draining && responses.size === 0) closeWhenQuiet(socket);
    });
  });

  return {
    drain() {
      if (draining) return draining;
      draining = new Promise<void>((resolve) => (drained = resolve));
      // net.Server#close stops accepting; http.Server#close would also destroy the idle-looking connections.
      net.Server.prototype.close.call(server);
      for (const [socket, responses] of inFlight) {
        for (const res of responses) if (!res.headersSent) res.setHeader("Connection", "close");
        if (responses.size === 0) closeWhenQuiet(socket);
      }
      settle();
      return draining;
    },
    destroyAll() {
      let cut = 0;
      for (const [socket, responses] of inFlight) {
        cut += responses.size;
        socket.destroy();
      }
      return cut;
    },
    stats() {
      let requests = 0;
      for (const responses of inFlight.values()) requests += responses.size;
      return { connections: inFlight.size, requests };
    },
  };
}
