/**
 * One suite run over every notice channel (style.md: several implementations of one interface
 * share one test suite), each against a real receiver. Skipped case: `log` has no receiver that
 * can be down (a log line cannot fail to be written from the channel's point of view).
 */
import { afterEach, describe, expect, it } from 'vitest';
import type { Notice } from '../../../server/src/alerts/types.ts';
import { CONFIG, T0 } from '../_runStates.ts';
import { emailRig, logRig, mqttRig, webhookRig } from './_receivers.ts';
import type { ChannelRig } from './_receivers.ts';

const notice: Notice = {
  id: 'n-run-1-3',
  runId: 'run-1',
  seq: 3,
  level: 'ACT NOW',
  kind: 'margin-outlook',
  conditionKey: 'margin',
  raisedAtMs: T0,
  title: 'ACT NOW: apply curing protection - margin closes at about 13:30, in about 1 h 10 min',
  text: 'ACT NOW - Harbour deck, bay 2 topping (site harbour-deck)\n\nWhat to do now: Now, cover the surface with wet burlap ... (a long line that a mail transport has to wrap somewhere past seventy-six characters) and keep it wet.',
  figures: {
    utilization: 0.42,
    marginMPa: 0.31,
    evaporationKgM2h: 0.85,
    expectedClosingMs: T0 + 4_200_000,
    probabilityCracking: 0.9,
  },
  deliveries: [],
  acknowledgedAtMs: null,
  acknowledgedBy: null,
  repeat: false,
};
const run = { id: 'run-1', site: CONFIG.site, config: CONFIG };

const suites: {
  name: string;
  start: () => Promise<ChannelRig>;
  recipients: string[];
  /** What the receiver must have got for the notice. */
  shows: (received: string) => boolean;
}[] = [
  {
    name: 'log',
    start: logRig,
    recipients: ['log'],
    shows: (line) => {
      const entry = JSON.parse(line) as Record<string, unknown>;
      return (
        entry.msg === notice.title &&
        entry.noticeId === notice.id &&
        entry.noticeLevel === 'ACT NOW' &&
        entry.level === 40
      );
    },
  },
  {
    name: 'mqtt',
    start: mqttRig,
    recipients: ['meniscus/harbour-deck/notices'],
    shows: (message) =>
      message.startsWith('meniscus/harbour-deck/notices ') &&
      JSON.stringify(JSON.parse(message.slice(message.indexOf(' ') + 1))) ===
        JSON.stringify(notice),
  },
  {
    name: 'webhook',
    start: () => webhookRig(),
    recipients: ['http://127.0.0.1:PORT/hooks/crew'],
    shows: (body) =>
      body.startsWith('application/json ') &&
      JSON.stringify(JSON.parse(body.slice(body.indexOf(' ') + 1))) === JSON.stringify(notice),
  },
  {
    name: 'email',
    start: emailRig,
    recipients: ['lead@harbour.example'],
    shows: (mail) =>
      mail.startsWith('to:lead@harbour.example\n') &&
      mail.includes(`Subject: ${notice.title}`) &&
      mail.includes('From: Meniscus <meniscus@harbour.example>') &&
      mail.includes(notice.text.replaceAll('\n', '\r\n')),
  },
];

describe.each(suites)('notice channel $name', ({ name, start, recipients, shows }) => {
  let rig: ChannelRig | null = null;
  afterEach(async () => {
    await rig?.close();
    rig = null;
  });

  it('recipients() names who gets the notices of a run', async () => {
    rig = await start();
    const named = rig.channel.recipients(run).map((r) => r.replace(/:\d+\//, ':PORT/'));
    expect(named).toEqual(recipients);
    expect(rig.channel.name).toBe(name);
  });

  it('send() delivers the notice to a real receiver', async () => {
    rig = await start();
    const [recipient] = rig.channel.recipients(run);
    await rig.channel.send(notice, recipient ?? '');
    await expect.poll(() => rig?.received().some(shows), { timeout: 3000 }).toBe(true);
  });

  // Skipped for `log`: it writes to the server's own log stream, which has no receiver to be down.
  it.skipIf(name === 'log')('send() rejects with a message when the receiver is down', async () => {
    rig = await start();
    await rig.stopReceiver?.();
    const [recipient] = rig.channel.recipients(run);
    await expect(rig.channel.send(notice, recipient ?? '')).rejects.toThrow(/\w+/);
  });
});
