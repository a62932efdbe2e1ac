import http from 'node:http';
import type { Socket } from 'node:net';
import type { Express } from 'express';

/**
 * The HTTP server for an Express app, whose requests and responses are made with the app's own prototypes
 * (`app.request`, `app.response`) instead of Node's.
 *
 * Express gives each request and response those prototypes as it enters the app, with `Object.setPrototypeOf`. On a
 * live object that call is slow in V8 (nodejs/node#37457), and here it also made short-lived request objects outlive
 * young-generation collections: an empty Express app under load kept 11-19 MB through each scavenge, nearly all of
 * it promoted at the next, and its scavenges took 8-15 ms, against 0.2 MB and 2 ms made this way (DEVELOPERS.md,
 * "Express's prototype switch"). Made with the right prototypes, the call finds them in place and changes nothing.
 * Creating the server with Express's prototypes is the way expressjs/express#5998 proposes.
 */
export function createServer(app: Express): http.Server {
  // Node's two constructors are plain functions, so these call them on an object already made with the app's prototype.
  // (`Reflect.construct` with these as the new target measured as slow as the prototype switch itself.)
  function Request(this: http.IncomingMessage, socket: Socket) {
    http.IncomingMessage.call(this, socket);
  }
  Request.prototype = app.request;
  // Node passes the response its options (the socket's high-water mark) too; @types/node names only the request.
  const ServerResponse = http.ServerResponse as unknown as (this: http.ServerResponse, req: http.IncomingMessage, options?: object) => void;
  function Response(this: http.ServerResponse, req: http.IncomingMessage, options?: object) {
    ServerResponse.call(this, req, options);
  }
  Response.prototype = app.response;
  return http.createServer({ IncomingMessage: Request as unknown as typeof http.IncomingMessage, ServerResponse: Response as unknown as typeof http.ServerResponse }, app);
}
