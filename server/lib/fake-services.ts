// Local stand-ins for hosted services, started by the scripts in development and tests:
// an SMTP server that keeps what it receives, and an S3-compatible object store.
import { randomUUID } from 'node:crypto';
import { mkdirSync } from 'node:fs';
import type { AddressInfo } from 'node:net';

export type ReceivedMail = { id: string; to: string[]; subject: string; text: string; html: string; receivedAt: Date };

export type FakeSmtp = {
  port: number;
  messages: ReceivedMail[];
  /** Refuses the next `count` messages with a temporary failure (451), for tests of retries. */
  refuseNext(count: number): void;
  /** Messages refused so far. */
  refused: number;
  /** The newest message to `address`, waiting up to `timeoutMs` for it to arrive. */
  waitFor(address: string, opts?: { subject?: RegExp; timeoutMs?: number; after?: number }): Promise<ReceivedMail>;
  close(): Promise<void>;
};

export async function startFakeSmtp(opts: { port?: number } = {}): Promise<FakeSmtp> {
  const { SMTPServer } = await import('smtp-server');
  const { simpleParser } = await import('mailparser');
  const messages: ReceivedMail[] = [];
  let toRefuse = 0;
  const state = { refused: 0 };
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    onData(stream, _session, callback) {
      if (toRefuse > 0) {
        toRefuse -= 1;
        state.refused += 1;
        stream.resume();
        stream.on('end', () => callback(Object.assign(new Error('Mailbox busy, try again later'), { responseCode: 451 })));
        return;
      }
      simpleParser(stream)
        .then((parsed) => {
          const to = [parsed.to].flat().flatMap((a) => (a ? a.value.map((v) => v.address ?? '') : []));
          messages.push({
            id: randomUUID(),
            to: to.map((t) => t.toLowerCase()),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : '',
            receivedAt: new Date(),
          });
          callback();
        })
        .catch(callback);
    },
  });
  await new Promise<void>((resolve) => server.listen(opts.port ?? 0, '127.0.0.1', resolve));
  const port = (server.server.address() as AddressInfo).port;
  return {
    port,
    messages,
    refuseNext(count) {
      toRefuse = count;
    },
    get refused() {
      return state.refused;
    },
    async waitFor(address, { subject, timeoutMs = 5000, after = 0 } = {}) {
      const deadline = Date.now() + timeoutMs;
      const want = address.toLowerCase();
      for (;;) {
        const found = messages
          .slice(after)
          .filter((m) => m.to.includes(want) && (!subject || subject.test(m.subject)))
          .at(-1);
        if (found) return found;
        if (Date.now() > deadline) throw new Error(`no mail to ${address} within ${timeoutMs} ms`);
        await new Promise((r) => setTimeout(r, 25));
      }
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

export type FakeS3 = { endpoint: string; close(): Promise<void> };

export async function startFakeS3(opts: { directory: string; port?: number }): Promise<FakeS3> {
  const { default: S3rver } = await import('s3rver');
  mkdirSync(opts.directory, { recursive: true });
  const instance = new S3rver({
    address: '127.0.0.1',
    port: opts.port ?? 0,
    silent: true,
    directory: opts.directory,
    resetOnClose: false,
  });
  const address = (await instance.run()) as AddressInfo | { address: string; port: number };
  return {
    endpoint: `http://127.0.0.1:${address.port}`,
    close: () => instance.close(),
  };
}
