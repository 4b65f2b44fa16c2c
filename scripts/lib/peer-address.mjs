// Preloaded into the app server (`node --import`, see startApp): react-router-serve hands the
// app a Fetch Request without the client's address, so this copies the socket's address into a
// request header, overwriting whatever a client sent under that name, and marks the process so
// the app knows the header can be trusted (app/lib/limits/client-address.server.ts).
import http from "node:http";

const HEADER = "x-hiltbench-peer";
globalThis[Symbol.for("hiltbench.peerAddressHeader")] = HEADER;
const emit = http.Server.prototype.emit;
http.Server.prototype.emit = function (event, req, ...rest) {
  if (event === "request" && req && req.headers) req.headers[HEADER] = req.socket?.remoteAddress ?? "";
  return emit.call(this, event, req, ...rest);
};
