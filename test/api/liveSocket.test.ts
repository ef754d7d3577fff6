import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { Socket } from 'socket.io-client';
import { EXAMPLE_PLACED_AT_MS, exampleRunInput } from '../helpers/exampleRun.ts';
import { connectSocketIo } from '../helpers/socketIoClient.ts';
import type { TestSocket } from '../helpers/socketIoClient.ts';
import { startLiveApiRig } from './_liveApiRig.ts';
import type { LiveApiRig } from './_liveApiRig.ts';

let rig: LiveApiRig;
let runId: string;
const sockets: TestSocket[] = [];

beforeEach(async () => {
  rig = await startLiveApiRig();
  const response = await fetch(`${rig.base}/api/runs`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify(exampleRunInput()),
  });
  runId = String(((await response.json()) as { id: string }).id);
});
afterEach(async () => {
  for (const socket of sockets.splice(0)) socket.close();
  await rig.close();
});

const publish = (minute: number) =>
  rig.ingestor.data(
    'meniscus/harbour-deck/probe-a/data',
    Buffer.from(
      // The fake engine consumes readings 10 min behind the newest: this releases `minute`.
      JSON.stringify([
        { bn: 'probe-a/', bt: EXAMPLE_PLACED_AT_MS / 1000 + minute * 60, n: 'rh-10', v: 97 },
        { t: 600, n: 'rh-10', v: 96 },
      ]),
    ),
  );

describe('socket.io live push', () => {
  it('join answers with the state now; each update pushes the same state GET /state returns', async () => {
    const socket = await connectSocketIo(rig.base);
    sockets.push(socket);
    const ack = await socket.socket.emitWithAck('join', runId);
    expect(ack.ok).toBe(true);
    expect(ack.ok && ack.state?.eventTimeMs).toBeNull();
    const pushed = socket.next('state');
    await publish(10);
    const state = await pushed;
    expect(state?.eventTimeMs).toBe(EXAMPLE_PLACED_AT_MS + 600_000);
    const rest = await (await fetch(`${rig.base}/api/runs/${runId}/state`)).json();
    expect(rest).toEqual(state);
  });

  it('?run=<id> at the handshake joins the room and sends the state at once', async () => {
    const socket = await connectSocketIo(rig.base, { run: runId });
    sockets.push(socket);
    const first = await socket.next('state');
    expect(first?.runId).toBe(runId);
  });

  it('a join for an unknown run is refused, and a client in no room gets nothing', async () => {
    const stranger = await connectSocketIo(rig.base);
    sockets.push(stranger);
    expect(await stranger.socket.emitWithAck('join', 'nope')).toEqual({
      ok: false,
      error: 'run "nope" does not exist',
    });
    const member = await connectSocketIo(rig.base, { run: runId });
    sockets.push(member);
    await member.next('state');
    const pushed = member.next('state');
    await publish(5);
    await pushed;
    expect(stranger.received('state')).toEqual([]);
  });

  it('join without an ack sends the state once; an unknown run gets join-error, also at the handshake', async () => {
    const socket = await connectSocketIo(rig.base);
    sockets.push(socket);
    // The typed events require the ack; the server also takes a join without one.
    const untyped = socket.socket as unknown as Socket;
    untyped.emit('join', runId);
    const state = await socket.next('state');
    expect(state?.runId).toBe(runId);
    expect(state).toEqual(await (await fetch(`${rig.base}/api/runs/${runId}/state`)).json());
    untyped.emit('join', 'nope');
    expect(await socket.next('join-error')).toBe('run "nope" does not exist');
    const refused = await connectSocketIo(rig.base, { run: 'nope' });
    sockets.push(refused);
    expect(await refused.next('join-error')).toBe('run "nope" does not exist');
    expect(refused.received('state')).toEqual([]);
  });

  it('after leave, no more states arrive', async () => {
    const socket = await connectSocketIo(rig.base);
    sockets.push(socket);
    expect((await socket.socket.emitWithAck('join', runId)).ok).toBe(true);
    socket.socket.emit('leave', runId);
    const watcher = await connectSocketIo(rig.base, { run: runId });
    sockets.push(watcher);
    await watcher.next('state');
    const pushed = watcher.next('state');
    await publish(5);
    await pushed;
    expect(socket.received('state')).toEqual([]);
  });
});
