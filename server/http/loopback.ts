// The local fakes (forecast, payments) listen on loopback only and stop at once.
import type http from 'node:http';
import type { AddressInfo } from 'node:net';

/**
 * Listens on 127.0.0.1 (port 0: any free port) and resolves with the port; a taken port rejects.
 * Errors after that are dropped: a local fake must never end the process.
 */
export async function listenOnLoopback(server: http.Server, port: number): Promise<number> {
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolve());
  });
  server.on('error', () => undefined);
  return (server.address() as AddressInfo).port;
}

/** Closes the server now, keep-alive connections included. */
export async function closeNow(server: http.Server): Promise<void> {
  server.closeAllConnections();
  await new Promise<void>((resolve) => server.close(() => resolve()));
}
