// Sends a report with its ETag, or 304 Not Modified when the caller already holds that version.
import type { Request, Response } from 'express';

export function sendTagged(req: Request, res: Response, tagged: { etag: string; report: object }) {
  res.set('Cache-Control', 'private, no-cache');
  res.set('ETag', `"${tagged.etag}"`);
  // req.fresh compares If-None-Match with the ETag just set (GET and HEAD only).
  if (req.fresh) {
    res.status(304).end();
    return;
  }
  res.json(tagged.report);
}
