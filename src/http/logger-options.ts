/**
 * pino options of the service log (server.ts): the level, the line shape of TROPODELAY_LOG_FORMAT, and
 * the redaction of keys. `iso` (the default) writes level names ("level":"info") and ISO 8601 UTC times
 * ("time":"2026-12-02T15:04:05.123Z"), what most log pipelines parse without configuration; `epoch` keeps
 * pino's own shape (numeric levels, 30 = info, and epoch milliseconds).
 */

import pino from 'pino';
import type { Config } from '../config.js';

export function loggerOptions(
  config: Pick<Config, 'LOG_LEVEL' | 'TROPODELAY_LOG_FORMAT'>,
  stream?: pino.DestinationStream,
): pino.LoggerOptions & { stream?: pino.DestinationStream } {
  const options: pino.LoggerOptions & { stream?: pino.DestinationStream } = {
    level: config.LOG_LEVEL,
    // Keys never reach the log: the Authorization header is redacted wherever a request is logged.
    redact: ['req.headers.authorization', 'headers.authorization'],
  };
  if (config.TROPODELAY_LOG_FORMAT === 'iso') {
    options.formatters = { level: (label) => ({ level: label }) };
    options.timestamp = pino.stdTimeFunctions.isoTime;
  }
  if (stream) options.stream = stream;
  return options;
}
