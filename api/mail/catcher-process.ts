// The development mail catcher as its own process: SMTP on loopback for every API worker to send
// to, and a loopback HTTP port that lists what arrived (GET /messages). Started by `npm start` and
// `npm test`; never in production. SMTP_PORT and MAIL_CATCHER_HTTP_PORT choose the ports.
import http from 'node:http';
import { startMailCatcher } from './mail-catcher';

const LOOPBACK = '127.0.0.1';

async function main() {
  if (process.env.NODE_ENV === 'production') {
    console.error('[sheaf] the mail catcher is a development tool and does not run in production');
    process.exit(1);
  }
  const catcher = await startMailCatcher({
    host: LOOPBACK,
    port: Number(process.env.SMTP_PORT ?? 2525),
  });
  const server = http.createServer((req, res) => {
    if (req.method === 'GET' && req.url === '/messages') {
      res.writeHead(200, { 'content-type': 'application/json' });
      res.end(JSON.stringify(catcher.messages.slice(0, 500)));
      return;
    }
    res.writeHead(404).end();
  });
  await new Promise<void>((resolve) =>
    server.listen(Number(process.env.MAIL_CATCHER_HTTP_PORT ?? 2526), LOOPBACK, resolve),
  );
  const address = server.address();
  const httpPort = typeof address === 'object' && address ? address.port : 0;
  console.log(
    `[sheaf] mail catcher ready: smtp://${LOOPBACK}:${catcher.port} http://${LOOPBACK}:${httpPort}`,
  );
  const stop = () => {
    server.close();
    void catcher.close().then(() => process.exit(0));
  };
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}

main().catch((error) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
