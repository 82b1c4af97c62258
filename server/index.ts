// Listen and shut down gracefully; everything else lives in server.ts and app.ts.
import { parseEnv } from './env';
import { logger } from './lib/logger';
import { startServer } from './server';

const running = await startServer(parseEnv());
logger.info(`Porewise is serving ${running.url}`);
if (running.outboxKey) logger.info(`Development mail outbox: ${running.url}/outbox?key=${running.outboxKey}`);

let stopping = false;
for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => {
    if (stopping) return;
    stopping = true;
    running.close().then(() => process.exit(0));
  });
}
