import http, { type IncomingMessage, type ServerResponse } from 'node:http'
import type { Express } from 'express'

type MessageClass = typeof http.IncomingMessage | typeof http.ServerResponse

/** Node's message types are still plain constructor functions, which a subtype can call on its own `this`. */
const callable = (Base: MessageClass) => !/^class\b/.test(Function.prototype.toString.call(Base))

/** A constructor that runs Base's on the new object, whose prototype is whatever `.prototype` holds at the time. */
function subtype<T extends MessageClass>(Base: T): T {
  function Message(this: object, ...args: unknown[]) {
    ;(Base as unknown as (...a: unknown[]) => void).apply(this, args)
  }
  Message.prototype = Base.prototype
  return Message as unknown as T
}

/**
 * Request and response types for node:http whose objects are born with an Express app's own prototypes.
 *
 * Express gives every request and response the app's prototypes with Object.setPrototypeOf. In V8 that leaves each
 * request with a hidden class of its own, so every property the middleware adds afterwards makes a new one (with a copy
 * of the property table), and every property read in the stack meets a different shape. Born with the same prototype,
 * Express's call changes nothing and all requests share one chain of shapes. The objects are the same ones as before
 * (an IncomingMessage and a ServerResponse with the app's methods); only where their prototype is set moves.
 *
 * The server is created before the app (it listens first, see start.ts), so `adopt` sets the prototypes once the app
 * exists; until then, and on a Node whose message types are classes, requests are made as usual.
 */
export function appMessages() {
  const usable = callable(http.IncomingMessage) && callable(http.ServerResponse)
  const Request = subtype(http.IncomingMessage)
  const Response = subtype(http.ServerResponse)
  return {
    /** For http.createServer. */
    options: (usable ? { IncomingMessage: Request, ServerResponse: Response } : {}) as http.ServerOptions<typeof IncomingMessage, typeof ServerResponse>,
    /** Whether requests are born with the app's prototypes once adopted (false on a Node where they cannot be). */
    usable,
    adopt(app: Express): void {
      ;(Request as { prototype: object }).prototype = app.request
      ;(Response as { prototype: object }).prototype = app.response
    },
  }
}
