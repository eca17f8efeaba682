import { randomUUID } from 'node:crypto';
import { io as connect, type Socket } from 'socket.io-client';

export interface LoadResult {
  label: string;
  messages: number;
  seconds: number;
  perSecond: number;
  p50Ms: number;
  p99Ms: number;
}

function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return 0;
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))]!;
}

export function openClient(url: string, cookie?: string): Promise<Socket> {
  const socket = connect(url, { transports: ['websocket'], reconnection: false, forceNew: true, extraHeaders: cookie ? { Cookie: cookie } : {} });
  return new Promise((resolve, reject) => {
    socket.once('connect', () => resolve(socket));
    socket.once('connect_error', reject);
  });
}

/** How long the receivers may take to see every message after the last ack. */
export const ARRIVAL_TIMEOUT_MS = 30_000;

/**
 * Drive `rooms` pairs of sockets: in each room the sender sends `perRoom` messages one after
 * another (waiting for each ack, as the app's client does) while all rooms run at once. Delivery
 * latency is send → arrival at the other socket of the room. A run in which some messages never
 * arrive throws instead of reporting: a throughput figure from a partial run would be a lie.
 */
export async function runLoad(label: string, pairs: { sender: Socket; receiver: Socket; roomId: number }[], perRoom: number, send: (socket: Socket, roomId: number, clientId: string, body: string) => Promise<void>): Promise<LoadResult> {
  const latencies: number[] = [];
  const sentAt = new Map<string, number>();
  let received = 0;
  const total = pairs.length * perRoom;
  let arrivedAll: () => void = () => {};
  const allArrived = new Promise<void>((resolve) => (arrivedAll = resolve));
  const onCreated = (message: { clientId: string }) => {
    const started = sentAt.get(message.clientId);
    if (started === undefined) return; // not from this run
    latencies.push(performance.now() - started);
    received += 1;
    if (received >= total) arrivedAll();
  };
  for (const { receiver } of pairs) receiver.on('message:created', onCreated);
  const start = performance.now();
  try {
    await Promise.all(
      pairs.map(async ({ sender, roomId }) => {
        for (let i = 0; i < perRoom; i += 1) {
          const clientId = randomUUID();
          sentAt.set(clientId, performance.now());
          await send(sender, roomId, clientId, `message ${i} in room ${roomId}`);
        }
      }),
    );
    let timer: NodeJS.Timeout | undefined;
    const complete = await Promise.race([allArrived.then(() => true), new Promise<boolean>((resolve) => (timer = setTimeout(() => resolve(false), ARRIVAL_TIMEOUT_MS)))]);
    clearTimeout(timer);
    if (!complete) {
      throw new Error(`BENCHMARK INCOMPLETE (${label}): only ${received} of ${total} messages reached their receivers within ${ARRIVAL_TIMEOUT_MS / 1000} s after the last ack. No figures are reported for a partial run.`);
    }
  } finally {
    for (const { receiver } of pairs) receiver.off('message:created', onCreated);
  }
  const seconds = (performance.now() - start) / 1000;
  latencies.sort((a, b) => a - b);
  return { label, messages: received, seconds, perSecond: received / seconds, p50Ms: percentile(latencies, 50), p99Ms: percentile(latencies, 99) };
}
