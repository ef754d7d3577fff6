/**
 * The outbox over a real archive with real channels: a webhook whose receiver answers 503, and
 * the log. Wall time is a fake clock moved by the test; flush() is called where a timer would.
 */
import { afterEach, describe, expect, it } from 'vitest';
import { NoticeOutbox, backoffMs } from '../../server/src/alerts/noticeOutbox.ts';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import { Archive } from '../../server/src/store/archive.ts';
import type { Notice } from '../../server/src/alerts/types.ts';
import { exampleRunInput } from '../helpers/exampleRun.ts';
import { T0 } from './_runStates.ts';
import { logRig, webhookRig } from './channels/_receivers.ts';
import type { ChannelRig } from './channels/_receivers.ts';

const rigs: ChannelRig[] = [];
afterEach(async () => {
  for (const rig of rigs.splice(0)) await rig.close();
});

async function setUp(maxAttempts = 4, hang = false) {
  const archive = Archive.open(':memory:');
  archive.createRun(parseRunConfig(exampleRunInput()), T0, 'run-1');
  let webhookStatus = hang ? 0 : 503;
  const webhook = await webhookRig(() => webhookStatus);
  const log = await logRig();
  rigs.push(webhook, log);
  const clock = { nowMs: 1_800_000_000_000 };
  const failures: string[] = [];
  const outbox = new NoticeOutbox(archive.notices, [log.channel, webhook.channel], {
    clock: () => clock.nowMs,
    maxAttempts,
    backoffS: 30,
    maxBackoffS: 600,
    onFailure: ({ channel, error }) => failures.push(`${channel}: ${error}`),
  });
  const notice = archive.notices.add(
    {
      runId: 'run-1',
      level: 'ACT NOW',
      kind: 'utilization',
      conditionKey: 'margin',
      raisedAtMs: T0,
      title: 'ACT NOW: apply curing protection',
      text: 'text',
      figures: {
        utilization: 0.6,
        marginMPa: 0.2,
        evaporationKgM2h: 0.5,
        expectedClosingMs: null,
        probabilityCracking: 0.5,
      },
      repeat: false,
    },
    [
      { channel: 'log', recipient: 'log' },
      { channel: 'webhook', recipient: webhook.channel.recipients({} as never)[0] ?? '' },
      { channel: 'pager', recipient: '+00 000' },
    ],
    clock.nowMs,
  );
  const deliveries = () =>
    (archive.notices.get('run-1', notice.id) as Notice).deliveries.map(
      (d) =>
        `${d.channel} ${d.status} ${d.attempts}${d.nextAttemptMs === null ? '' : ` next+${(d.nextAttemptMs - clock.nowMs) / 1000}s`}`,
    );
  return {
    archive,
    outbox,
    clock,
    failures,
    deliveries,
    webhook,
    recover: () => (webhookStatus = 200),
  };
}

describe('NoticeOutbox', () => {
  it('backoffMs() doubles from 30 s up to the cap of 600 s', () => {
    expect([1, 2, 3, 4, 5, 6, 7].map((n) => backoffMs(n, 30, 600) / 1000)).toEqual([
      30, 60, 120, 240, 480, 600, 600,
    ]);
  });

  it('flush() delivers over the working channel while a failing one is recorded as failed and retried after the backoff, until it is delivered', async () => {
    const rig = await setUp();
    expect(await rig.outbox.flush()).toBe(3);
    expect(rig.deliveries()).toEqual(['log sent 1', 'webhook failed 1 next+30s', 'pager failed 1']);
    // each delivery is sent on its own: the order of the failures is not fixed
    expect([...rig.failures].sort()).toEqual([
      'pager: channel pager is not configured on this server',
      expect.stringMatching(/^webhook: POST http:\/\/127\.0\.0\.1:\d+\/hooks\/crew answered 503$/),
    ]);
    // nothing is due before the backoff has passed
    rig.clock.nowMs += 29_000;
    expect(await rig.outbox.flush()).toBe(0);
    rig.clock.nowMs += 1_000;
    expect(await rig.outbox.flush()).toBe(1);
    expect(rig.deliveries()[1]).toBe('webhook failed 2 next+60s');
    rig.recover();
    rig.clock.nowMs += 60_000;
    await rig.outbox.flush();
    expect(rig.deliveries()).toEqual(['log sent 1', 'webhook sent 3', 'pager failed 1']);
    expect(rig.webhook.received()).toHaveLength(1);
    expect(rig.outbox.counters).toEqual({ sent: 2, failedAttempts: 3, givenUp: 1 });
    expect(rig.archive.notices.nextDueMs()).toBeNull();
  });

  it('flush() gives a delivery up after maxAttempts, with its last error kept', async () => {
    const rig = await setUp(3);
    for (let attempt = 0; attempt < 5; attempt += 1) {
      await rig.outbox.flush();
      rig.clock.nowMs += 600_000;
    }
    const webhook = (rig.archive.notices.list('run-1')[0] as Notice).deliveries[1];
    expect(webhook).toMatchObject({ status: 'failed', attempts: 3, nextAttemptMs: null });
    expect(webhook?.error).toMatch(/answered 503$/);
  });

  it('flush() records a receiver that is down as failed without holding up the log', async () => {
    const rig = await setUp();
    await rig.webhook.stopReceiver?.();
    await rig.outbox.flush();
    expect(rig.deliveries().slice(0, 2)).toEqual(['log sent 1', 'webhook failed 1 next+30s']);
    const webhook = (rig.archive.notices.list('run-1')[0] as Notice).deliveries[1];
    expect(webhook?.error).toMatch(/^POST http:\/\/127\.0\.0\.1:\d+\/hooks\/crew failed: /);
  });

  it('flush() does not hold up the others while a receiver hangs, and never sends a delivery twice at once', async () => {
    const rig = await setUp(4, true);
    const first = rig.outbox.flush();
    await expect.poll(() => rig.deliveries()[0]).toBe('log sent 1');
    expect(rig.deliveries()[1]).toBe('webhook pending 0 next+0s');
    // a second look while the webhook hangs starts nothing new
    expect(await Promise.race([rig.outbox.flush(), Promise.resolve('waiting')])).toBe('waiting');
    await rig.webhook.stopReceiver?.();
    expect(await first).toBe(3);
    expect(rig.deliveries()[1]).toBe('webhook failed 1 next+30s');
  });
});
