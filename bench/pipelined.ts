/**
 * Server time per request while the server is never idle: one keep-alive connection on
 * which the next request is always already queued (HTTP/1.1 pipelining, RFC 9112 §9.3).
 * Node's HTTP server handles pipelined requests one after the other, so each request's
 * `Server-Timing: app` still runs from its own arrival to its own headers, but no request
 * starts on a processor that has just been idle, waiting for the client's next round trip.
 */
import net from 'node:net';

export interface PipelinedOptions {
  port: number;
  path: string;
  headers: Record<string, string>;
  body: string;
  /** requests sent in all; the first `warmUp` are not measured */
  requests: number;
  warmUp: number;
}

/** The `app` durations (ms) of the measured requests. Rejects on a non-200 answer. */
export function pipelinedServerTimes(o: PipelinedOptions): Promise<number[]> {
  const head = [`POST ${o.path} HTTP/1.1`, 'Host: 127.0.0.1', `Content-Length: ${Buffer.byteLength(o.body)}`,
    ...Object.entries(o.headers).map(([k, v]) => `${k}: ${v}`)].join('\r\n');
  const request = `${head}\r\n\r\n${o.body}`;
  return new Promise((resolve, reject) => {
    const times: number[] = [];
    const sock = net.connect(o.port, '127.0.0.1');
    let pending: Buffer = Buffer.alloc(0);
    let sent = 0;
    let answered = 0;
    const send = () => {
      if (sent < o.requests) {
        sock.write(request);
        sent++;
      }
    };
    sock.on('connect', () => {
      // two in flight: while one is handled, the next waits in the server's socket
      send();
      send();
    });
    sock.on('error', reject);
    sock.on('data', (chunk: Buffer) => {
      pending = pending.length ? Buffer.concat([pending, chunk]) : chunk;
      for (;;) {
        const end = pending.indexOf('\r\n\r\n');
        if (end < 0) return;
        const text = pending.subarray(0, end).toString('latin1');
        const length = Number(/\r\ncontent-length:\s*(\d+)/i.exec(text)?.[1] ?? NaN);
        if (!Number.isFinite(length)) return reject(new Error(`answer without Content-Length: ${text.slice(0, 200)}`));
        if (pending.length < end + 4 + length) return;
        pending = pending.subarray(end + 4 + length);
        if (!text.startsWith('HTTP/1.1 200')) return reject(new Error(`answered ${text.split('\r\n')[0]}`));
        answered++;
        const app = /app;dur=([\d.]+)/.exec(text);
        if (app && answered > o.warmUp) times.push(Number(app[1]));
        if (answered === o.requests) {
          sock.end();
          return resolve(times);
        }
        send();
      }
    });
  });
}
