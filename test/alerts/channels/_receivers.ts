/**
 * Real receivers for the notice channels' shared suite: a pino stream, the embedded MQTT broker
 * with a subscriber, a local HTTP server, and an in-process SMTP server (smtp-server). Each
 * starts on a free port, collects what it receives, and can be stopped to test a failure.
 */
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import mqtt from 'mqtt';
import { pino } from 'pino';
import { SMTPServer } from 'smtp-server';
import { emailChannel } from '../../../server/src/alerts/channels/emailChannel.ts';
import { logChannel } from '../../../server/src/alerts/channels/logChannel.ts';
import {
  connectNoticeClient,
  mqttChannel,
} from '../../../server/src/alerts/channels/mqttChannel.ts';
import type { NoticeChannel } from '../../../server/src/alerts/channels/noticeChannel.ts';
import { webhookChannel } from '../../../server/src/alerts/channels/webhookChannel.ts';
import { startEmbeddedBroker } from '../../../server/src/mqtt/embeddedBroker.ts';

/** A channel wired to its receiver. */
export interface ChannelRig {
  channel: NoticeChannel;
  /** Everything received so far, as text (a log line, a payload, a body, a decoded e-mail). */
  received(): string[];
  /** Makes the receiver unreachable (null: this channel has no receiver that can be down). */
  stopReceiver: (() => Promise<void>) | null;
  close(): Promise<void>;
}

export async function logRig(): Promise<ChannelRig> {
  const lines: string[] = [];
  const logger = pino({ level: 'info' }, { write: (line: string) => lines.push(line) });
  return {
    channel: logChannel(logger),
    received: () => lines,
    stopReceiver: null,
    close: () => Promise.resolve(),
  };
}

export async function mqttRig(): Promise<ChannelRig> {
  const broker = await startEmbeddedBroker(
    { data: () => Promise.resolve(), status: () => {} },
    { port: 0 },
  );
  const url = `mqtt://127.0.0.1:${broker.port}`;
  const payloads: string[] = [];
  const subscriber = mqtt.connect(url, { clientId: 'notice-test-subscriber' });
  await new Promise<void>((resolve, reject) => {
    subscriber.once('connect', () =>
      subscriber.subscribe('meniscus/+/notices', { qos: 1 }, (error) =>
        error ? reject(error) : resolve(),
      ),
    );
  });
  subscriber.on('message', (topic, payload) => payloads.push(`${topic} ${payload.toString()}`));
  const publisher = connectNoticeClient(url, { clientId: 'notice-test-publisher' });
  await new Promise((resolve) => publisher.once('connect', resolve));
  const channel = mqttChannel(publisher);
  let stopped = false;
  return {
    channel,
    received: () => payloads,
    stopReceiver: async () => {
      stopped = true;
      await broker.close();
    },
    async close() {
      await channel.close?.();
      await new Promise<void>((resolve) => subscriber.end(true, {}, () => resolve()));
      if (!stopped) await broker.close();
    },
  };
}

/** A webhook receiver answering `status()` (200 unless a test changes it; 0: never answers). */
export async function webhookRig(status: () => number = () => 200): Promise<ChannelRig> {
  const bodies: string[] = [];
  const server = createServer((request, response) => {
    let body = '';
    request.on('data', (chunk: Buffer) => (body += chunk.toString()));
    request.on('end', () => {
      const code = status();
      if (code === 0) return; // hangs until the server is closed
      if (code < 300) bodies.push(`${request.headers['content-type'] ?? ''} ${body}`);
      response.writeHead(code).end();
    });
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  let stopped = false;
  const stop = () =>
    new Promise<void>((resolve) => {
      stopped = true;
      server.close(() => resolve());
      server.closeAllConnections();
    });
  return {
    channel: webhookChannel(`http://127.0.0.1:${port}/hooks/crew`, 2000),
    received: () => bodies,
    stopReceiver: stop,
    close: () => (stopped ? Promise.resolve() : stop()),
  };
}

/** Decodes a quoted-printable body (RFC 2045 6.7): soft line breaks and =XX octets. */
function quotedPrintable(text: string): string {
  const bytes = text
    .replace(/=\r?\n/g, '')
    .replace(/=([0-9A-F]{2})/g, (_m, hex: string) => String.fromCharCode(parseInt(hex, 16)));
  return Buffer.from(bytes, 'latin1').toString('utf8');
}

export async function emailRig(): Promise<ChannelRig> {
  const mails: string[] = [];
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, session, callback) {
      let raw = '';
      stream.on('data', (chunk: Buffer) => (raw += chunk.toString('latin1')));
      stream.on('end', () => {
        const to = session.envelope.rcptTo.map((address) => address.address).join(',');
        // unfold headers, decode the body
        mails.push(`to:${to}\n${quotedPrintable(raw.replace(/\r\n[ \t]+/g, ' '))}`);
        callback();
      });
    },
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.server.address() as AddressInfo;
  let stopped = false;
  const stop = () =>
    new Promise<void>((resolve) => {
      stopped = true;
      server.close(() => resolve());
    });
  const channel = emailChannel(
    `smtp://127.0.0.1:${port}?ignoreTLS=true`,
    'Meniscus <meniscus@harbour.example>',
  );
  return {
    channel,
    received: () => mails,
    stopReceiver: stop,
    async close() {
      await channel.close?.();
      if (!stopped) await stop();
    },
  };
}
