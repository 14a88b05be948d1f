import 'server-only';
import http from 'node:http';

// The address of the connection a request came in on, for the sign-in throttle (lib/auth/throttle.ts).
// Route handlers never see the socket, and the X-Forwarded-For that Next adds from it is only added when the
// client sent none, so a client talking to the app directly could name any address it liked. This stamps
// every request the Node.js server receives with the socket's address, replacing any header of that name
// the client sent. Installed once by instrumentation.ts when the server starts.

export const PEER_HEADER = 'x-ohm-peer';
const INSTALLED = Symbol.for('ohmstead.peer-header');

type Emit = (this: http.Server, event: string | symbol, ...args: unknown[]) => boolean;

export function stampPeerAddress(): void {
  const proto = http.Server.prototype as unknown as { emit: Emit; [INSTALLED]?: true };
  if (proto[INSTALLED]) return;
  const emit = proto.emit;
  proto.emit = function (this: http.Server, event: string | symbol, ...args: unknown[]) {
    if (event === 'request') {
      const req = args[0] as http.IncomingMessage;
      req.headers[PEER_HEADER] = req.socket?.remoteAddress ?? '';
    }
    return emit.call(this, event, ...args);
  };
  proto[INSTALLED] = true;
}
