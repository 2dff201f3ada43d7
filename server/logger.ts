import { pino, type Logger } from 'pino';
import type { Config } from './config';

/** JSON lines in production (for log collectors); readable, coloured lines for a person in local mode. */
export function createLogger(config: Config): Logger {
  if (!config.local || config.logLevel === 'silent') return pino({ level: config.logLevel });
  return pino({
    level: config.logLevel,
    transport: { target: 'pino-pretty', options: { translateTime: 'HH:MM:ss', ignore: 'pid,hostname,req,res', singleLine: true } },
  });
}
