// A local SMTP catcher on loopback (smtp-server + mailparser) for development and tests: keeps
// sent mail in memory so the demo and the tests can read it; nothing leaves the machine. It runs
// as its own process (catcher-process.ts) so every API worker sends to, and reads from, one place.
import { SMTPServer } from 'smtp-server';
import { simpleParser, type AddressObject } from 'mailparser';
import type { CaughtMail } from '../../shared/schemas/auth';

export interface MailCatcher {
  port: number;
  messages: CaughtMail[];
  /** Resolves with the first message (already caught or arriving) that matches. */
  waitFor(match: (mail: CaughtMail) => boolean, timeoutMs?: number): Promise<CaughtMail>;
  close(): Promise<void>;
}

function addresses(value: AddressObject | AddressObject[] | undefined): string[] {
  if (!value) return [];
  const list = Array.isArray(value) ? value : [value];
  return list.flatMap((a) => a.value.map((v) => v.address ?? '')).filter(Boolean);
}

export async function startMailCatcher(
  options: { host?: string; port?: number; keep?: number } = {},
): Promise<MailCatcher> {
  const messages: CaughtMail[] = [];
  const waiters: { match: (m: CaughtMail) => boolean; resolve: (m: CaughtMail) => void }[] = [];
  const keep = options.keep ?? 500;
  let counter = 0;
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    size: 5 * 1024 * 1024,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          counter += 1;
          const mail: CaughtMail = {
            id: `${Date.now()}-${counter}`,
            to: addresses(parsed.to),
            from: addresses(parsed.from)[0] ?? '',
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : null,
            receivedAt: new Date().toISOString(),
          };
          messages.unshift(mail);
          if (messages.length > keep) messages.length = keep;
          for (const waiter of [...waiters]) {
            if (waiter.match(mail)) {
              waiters.splice(waiters.indexOf(waiter), 1);
              waiter.resolve(mail);
            }
          }
          callback();
        })
        .catch((error: Error) => callback(error));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 2525, options.host ?? '127.0.0.1', () => resolve());
  });
  const address = server.server.address();
  const port = typeof address === 'object' && address ? address.port : (options.port ?? 2525);
  return {
    port,
    messages,
    waitFor(match, timeoutMs = 10_000) {
      const found = messages.find(match);
      if (found) return Promise.resolve(found);
      return new Promise((resolve, reject) => {
        const waiter = { match, resolve };
        waiters.push(waiter);
        setTimeout(() => {
          const i = waiters.indexOf(waiter);
          if (i >= 0) {
            waiters.splice(i, 1);
            reject(new Error('No matching e-mail arrived in time'));
          }
        }, timeoutMs).unref();
      });
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

/** Reads the caught mail of a catcher process over its loopback HTTP port. */
export async function fetchCaughtMail(catcherUrl: string): Promise<CaughtMail[]> {
  const res = await fetch(new URL('/messages', catcherUrl), { signal: AbortSignal.timeout(3000) });
  if (!res.ok) throw new Error(`The mail catcher answered ${res.status}`);
  return (await res.json()) as CaughtMail[];
}
