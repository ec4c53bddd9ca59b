import type { RequestHandler } from 'express';
import { performance } from 'node:perf_hooks';

/**
 * Adds `Server-Timing: app;dur=<ms>` to every answer: the time from the request's arrival
 * at the app to the moment its headers are written (handlers, database, serialisation).
 */
export const serverTiming: RequestHandler = (_req, res, next) => {
  const t0 = performance.now();
  const writeHead = res.writeHead;
  res.writeHead = function (this: typeof res, ...args: Parameters<typeof res.writeHead>) {
    const app = `app;dur=${(performance.now() - t0).toFixed(3)}`;
    const prev = this.getHeader('Server-Timing');
    this.setHeader('Server-Timing', prev ? `${String(prev)}, ${app}` : app);
    return writeHead.apply(this, args);
  } as typeof res.writeHead;
  next();
};
