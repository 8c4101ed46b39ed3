import http from "node:http";
import { PEER_HEADER } from "@/lib/http/client-address";

const PATCHED = Symbol.for("ecotone.peerAddress");

/** Puts each request's socket address in PEER_HEADER before Next sees the request. */
export function recordPeerAddresses(): void {
  const proto = http.Server.prototype as http.Server & { [PATCHED]?: boolean };
  if (proto[PATCHED]) return;
  proto[PATCHED] = true;
  const emit = proto.emit;
  proto.emit = function (this: http.Server, event: string | symbol, ...args: unknown[]) {
    if (event === "request") {
      const req = args[0] as http.IncomingMessage;
      req.headers[PEER_HEADER] = req.socket?.remoteAddress ?? "unknown";
    }
    return (emit as (...a: unknown[]) => boolean).apply(this, [event, ...args]);
  } as typeof proto.emit;
}
