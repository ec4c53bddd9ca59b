import type { Server } from 'node:http';

/**
 * Stops accepting connections, lets requests in flight finish (up to `graceMs`), then drops
 * what is left. Only after this may the database pool be destroyed: a handler still waiting
 * for a connection would otherwise fail with "aborted".
 */
export function closeGracefully(server: Server, graceMs = 5000): Promise<void> {
  return new Promise((resolve) => {
    const timer = setTimeout(() => server.closeAllConnections(), graceMs);
    server.close(() => {
      clearTimeout(timer);
      resolve();
    });
    server.closeIdleConnections();
  });
}
