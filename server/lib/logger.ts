import pino, { type Logger } from 'pino';

/** The server's JSON logger; tests pass level "silent". */
export function createLogger(level: string): Logger {
  return pino({ level, base: { service: 'heapsight' }, redact: ['req.headers.authorization', 'req.headers.cookie'] });
}
