/** What ingest hands its messages to, and what a broker connection reports about itself. */

/** Receives MQTT messages; `data` resolves once the message is committed. */
export interface MessageSink {
  data(topic: string, payload: Uint8Array): Promise<void>;
  status(topic: string, payload: Uint8Array): void;
}

export interface BrokerState {
  kind: 'embedded' | 'external';
  /** For embedded: listening; for external: connected to the broker. */
  connected: boolean;
  /** `mqtt://host:port` of the broker. */
  url: string;
  /** Embedded: connected MQTT clients. External: times the client reconnected. */
  clients?: number;
  reconnects?: number;
  lastError: string | null;
}

/** A running connection to readings: the embedded broker or a client of an external one. */
export interface BrokerConnection {
  state(): BrokerState;
  close(): Promise<void>;
}
