import type { AddressInfo } from 'node:net';
import { SMTPServer } from 'smtp-server';
import { storeReceivedMail } from './store';

/** The largest message the catcher accepts (it answers 552 above it). */
export const CATCHER_MAX_BYTES = 2 * 1024 * 1024;
/** The most recipients one message may have. */
export const CATCHER_MAX_RECIPIENTS = 100;

/** A running catcher. */
export interface MailCatcher {
  host: string;
  port: number;
  stop(): Promise<void>;
}

/** An SMTP reply with a code (smtp-server sends `responseCode` to the client). */
function smtpError(code: number, message: string): Error {
  return Object.assign(new Error(message), { responseCode: code });
}

/**
 * Starts the local mail catcher: an SMTP server on loopback that accepts any message (no
 * authentication, no TLS: it never leaves the machine), parses it with mailparser and stores it in
 * PostgreSQL, where the Outbox page reads it. A message is acknowledged only once it is stored, so
 * a database outage makes the sender retry instead of losing it. Port 0 picks a free port.
 *
 * @example
 * const catcher = await startMailCatcher({ port: 2525 });
 * await catcher.stop();
 */
export async function startMailCatcher(options: { port: number; host?: string }): Promise<MailCatcher> {
  const host = options.host ?? '127.0.0.1';
  const server = new SMTPServer({
    name: 'doublet-catcher',
    banner: 'Doublet local mail catcher',
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    size: CATCHER_MAX_BYTES,
    maxClients: 20,
    socketTimeout: 30_000,
    closeTimeout: 5_000,
    logger: false,
    onRcptTo(_address, session, callback) {
      if (session.envelope.rcptTo.length >= CATCHER_MAX_RECIPIENTS) {
        return callback(smtpError(452, `At most ${CATCHER_MAX_RECIPIENTS} recipients a message.`));
      }
      callback();
    },
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => {
        if (!stream.sizeExceeded) chunks.push(chunk);
      });
      stream.on('error', (error) => callback(error));
      stream.on('end', () => {
        if (stream.sizeExceeded) return callback(smtpError(552, `Message larger than ${CATCHER_MAX_BYTES} bytes.`));
        const mailFrom = session.envelope.mailFrom;
        storeReceivedMail({
          raw: Buffer.concat(chunks),
          envelopeFrom: mailFrom ? mailFrom.address : null,
          envelopeTo: session.envelope.rcptTo.map((r) => r.address),
        }).then(
          () => callback(null),
          (error: unknown) => {
            // Temporary failure: the sender keeps the message and tries again. No message text here.
            console.error(`mail catcher: could not store a message: ${error instanceof Error ? error.message : String(error)}`);
            callback(smtpError(451, 'Could not store the message; try again later.'));
          },
        );
      });
    },
  });
  let listening = false;
  // smtp-server re-emits its socket's errors; before listening, the promise below reports them.
  server.on('error', (error) => {
    if (listening) console.error(`mail catcher: ${error.message}`);
  });
  await new Promise<void>((resolve, reject) => {
    const onError = (error: NodeJS.ErrnoException) => {
      reject(
        error.code === 'EADDRINUSE'
          ? new Error(`The mail catcher cannot listen on ${host}:${options.port}, which is in use: set DOUBLET_SMTP_PORT to a free port, or SMTP_URL to a real mail server.`)
          : error,
      );
    };
    server.server.once('error', onError);
    server.listen(options.port, host, () => {
      server.server.off('error', onError);
      listening = true;
      resolve();
    });
  });
  const port = (server.server.address() as AddressInfo).port;
  let stopped: Promise<void> | undefined;
  return {
    host,
    port,
    stop() {
      stopped ??= new Promise<void>((resolve) => server.close(() => resolve()));
      return stopped;
    },
  };
}
