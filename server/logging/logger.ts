import pino, { type DestinationStream, type Logger, type LoggerOptions } from 'pino';
import type { Config } from '../config';

export type { Logger } from 'pino';

/**
 * What never reaches a log line, wherever it sits in a logged object: the session cookie and the
 * cookies set in an answer, the XSRF token, passwords, tokens (sign-in, reset, invitation links) and
 * e-mail addresses and bodies. The request line itself holds none of these (see request-log.ts);
 * this list catches an object logged somewhere else that happens to carry one.
 */
export const REDACT_PATHS = [
  'req.headers.cookie',
  'req.headers.authorization',
  'req.headers["x-xsrf-token"]',
  'res.headers["set-cookie"]',
  'headers.cookie',
  'headers["x-xsrf-token"]',
  'req.body',
  'password',
  'token',
  '*.password',
  '*.newPassword',
  '*.currentPassword',
  '*.token',
  '*.cookie',
  '*.to_address',
  '*.text_body',
  '*.html_body',
];

/**
 * The process's logger: one JSON object per line in production and test (level from LOG_LEVEL,
 * silent in test unless LOG_LEVEL is set), readable colored lines in development. Pretty printing
 * runs in pino's transport thread, so formatting never holds up requests; pino-pretty is a local
 * package, nothing is fetched. `destination` (tests) takes the JSON lines instead of stdout.
 */
export function createLogger(config: Pick<Config, 'env' | 'logLevel'>, destination?: DestinationStream): Logger {
  const options: LoggerOptions = {
    level: config.logLevel,
    base: { pid: process.pid },
    redact: { paths: REDACT_PATHS, censor: '[redacted]' },
  };
  if (destination) return pino(options, destination);
  if (config.env === 'development') {
    return pino({
      ...options,
      transport: {
        target: 'pino-pretty',
        options: { colorize: true, singleLine: true, translateTime: 'SYS:HH:MM:ss.l', ignore: 'pid,hostname' },
      },
    });
  }
  return pino(options);
}

/** A logger that writes nothing (the default for parts built without one, such as a test's worker). */
export const silentLogger = (): Logger => pino({ level: 'silent' });
