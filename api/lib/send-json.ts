// Sends a JSON body, serialising each object at most once: cached report responses are the
// same object on every request, and a pooled report of 200 sites is ~350 kB of JSON.
import type { Response } from 'express';

const serialised = new WeakMap<object, string>();

export function sendJson(res: Response, body: object): void {
  let text = serialised.get(body);
  if (text === undefined) {
    text = JSON.stringify(body);
    serialised.set(body, text);
  }
  res.type('application/json').send(text);
}
