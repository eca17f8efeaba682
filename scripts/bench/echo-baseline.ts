import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { Server } from 'socket.io';

/**
 * The baseline: a bare socket.io server that does what the chat does minus the app — join a room,
 * ack a message and broadcast it to the room — with no session, validation or database.
 */
export async function startEchoServer() {
  const http = createServer();
  const io = new Server(http, { serveClient: false });
  io.on('connection', (socket) => {
    socket.on('room:join', (payload: { consultationId: number }, ack: (r: unknown) => void) => {
      void socket.join(`room:${payload.consultationId}`);
      ack({ status: 'OK' });
    });
    socket.on('message:send', (payload: { consultationId: number; clientId: string; body: string }, ack: (r: unknown) => void) => {
      socket.to(`room:${payload.consultationId}`).emit('message:created', payload);
      ack({ status: 'OK', data: payload });
    });
  });
  await new Promise<void>((resolve) => http.listen(0, '127.0.0.1', () => resolve()));
  return { url: `http://127.0.0.1:${(http.address() as AddressInfo).port}`, close: () => new Promise<void>((resolve) => io.close(() => resolve())) };
}
