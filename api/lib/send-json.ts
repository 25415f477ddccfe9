// Sends a JSON body, serialising and encoding each object at most once: cached report responses
// are the same object on every request, and a pooled report of 200 sites is ~350 kB of JSON.
import type { Response } from 'express';

const encoded = new WeakMap<object, Buffer>();

export function sendJson(res: Response, body: object): void {
  let bytes = encoded.get(body);
  if (bytes === undefined) {
    bytes = Buffer.from(JSON.stringify(body));
    encoded.set(body, bytes);
  }
  res.type('application/json').send(bytes);
}
