import pino from 'pino';

/** The app's structured logger (JSON lines on stdout). */
export function createLogger(level: string) {
  return pino({ level, redact: ['req.headers.cookie', 'req.headers["x-csrf-token"]', 'res.headers["set-cookie"]'] });
}
export type Logger = ReturnType<typeof createLogger>;
