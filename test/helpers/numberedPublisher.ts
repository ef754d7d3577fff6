/**
 * A device that publishes numbered readings at QoS 1 and remembers which ones the broker
 * acknowledged. Reading i has event time `startS` s + i ms, so the archive can be checked
 * reading by reading (up to 3,000,000 readings stay in the past).
 */
import mqtt from 'mqtt';
import type { MqttClient } from 'mqtt';

export interface NumberedPublisher {
  /** Indices whose PUBACK arrived. */
  readonly acknowledged: Set<number>;
  readonly startS: number;
  /** Stops publishing new readings and waits until everything sent is acknowledged (or `timeoutMs`). */
  stop(timeoutMs?: number): Promise<void>;
}

export function startNumberedPublisher(
  url: string,
  topic: string,
  sensor: string,
  options: { clientId: string; ratePerS?: number; inFlight?: number },
): NumberedPublisher {
  const startS = Math.floor(Date.now() / 1000) - 3000;
  const acknowledged = new Set<number>();
  const client: MqttClient = mqtt.connect(url, {
    clientId: options.clientId,
    clean: false,
    protocolVersion: 4,
    reconnectPeriod: 100,
    connectTimeout: 2000,
  });
  client.on('error', () => {});
  let next = 0;
  let pending = 0;
  let stopped = false;
  const inFlight = options.inFlight ?? 20;
  const perTick = Math.max(1, Math.round((options.ratePerS ?? 500) / 100));
  const timer = setInterval(() => {
    for (let sent = 0; !stopped && pending < inFlight && sent < perTick; sent += 1) {
      const index = next;
      next += 1;
      pending += 1;
      const payload = JSON.stringify([
        { n: sensor, u: '%RH', v: 80 + (index % 200) / 10, t: (startS * 1000 + index) / 1000 },
      ]);
      client.publish(topic, payload, { qos: 1 }, (error) => {
        pending -= 1;
        if (!error) acknowledged.add(index);
      });
    }
  }, 10);
  return {
    acknowledged,
    startS,
    async stop(timeoutMs = 20_000) {
      stopped = true;
      clearInterval(timer);
      const deadline = Date.now() + timeoutMs;
      while (pending > 0 && Date.now() < deadline)
        await new Promise((resolve) => setTimeout(resolve, 20));
      await client.endAsync(true);
    },
  };
}
