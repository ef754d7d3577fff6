/**
 * The `mqtt` channel: each notice's JSON published to `meniscus/<site>/notices` at QoS 1 (not
 * retained), through an MQTT.js client of the server's broker (the embedded one, or the external
 * broker with the server's credentials, which its ACL must allow to publish there).
 */
import mqtt from 'mqtt';
import type { IClientOptions, MqttClient } from 'mqtt';
import type { Notice } from '../types.ts';
import type { NoticeChannel } from './noticeChannel.ts';

/** Topic of a site's crew notices. */
export function noticeTopic(site: string): string {
  return `meniscus/${site}/notices`;
}

/**
 * A channel publishing through `client` (which it ends on close). A notice sent while the client
 * is not connected fails at once (and the outbox tries again) rather than waiting in MQTT.js's
 * memory, where a restart would lose it.
 *
 * @param timeoutMs - longest wait for the broker's PUBACK, ms [10,000, our assumption]
 */
export function mqttChannel(client: MqttClient, timeoutMs = 10_000): NoticeChannel {
  return {
    name: 'mqtt',
    recipients: (run) => [noticeTopic(run.site)],
    send(notice: Notice, topic: string) {
      if (!client.connected) return Promise.reject(new Error('not connected to the broker'));
      return new Promise<void>((resolve, reject) => {
        const timer = setTimeout(
          () => reject(new Error(`no acknowledgement from the broker within ${timeoutMs} ms`)),
          timeoutMs,
        );
        client.publish(topic, JSON.stringify(notice), { qos: 1 }, (error) => {
          clearTimeout(timer);
          if (error) reject(error);
          else resolve();
        });
      });
    },
    close: () => new Promise<void>((resolve) => client.end(true, {}, () => resolve())),
  };
}

/**
 * An MQTT.js client of the broker at `url` for mqttChannel(), reconnecting every second;
 * connection errors show as failed deliveries.
 *
 * @param options - MQTT.js options (client id, credentials, TLS)
 */
export function connectNoticeClient(url: string, options: IClientOptions): MqttClient {
  const client = mqtt.connect(url, { reconnectPeriod: 1000, ...options });
  client.on('error', () => {
    // Shown as failed deliveries; the client keeps reconnecting.
  });
  return client;
}
