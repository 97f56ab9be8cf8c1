// The only logger: levels and structured fields; JSON lines in production, readable text otherwise.
// Never pass passwords, tokens, session ids or signals as fields: redact() strips the usual keys anyway.

type Level = 'debug' | 'info' | 'warn' | 'error';
const ORDER: Record<Level | 'silent', number> = { debug: 10, info: 20, warn: 30, error: 40, silent: 99 };
const SECRET_KEYS = /pass(word)?|token|secret|cookie|session|authorization/i;

/** Structured fields attached to a log line. */
export type LogFields = Record<string, unknown>;

/** A logger with levels; child() adds fields (requestId, userId, task) to every line. */
export interface Logger {
  debug(message: string, fields?: LogFields): void;
  info(message: string, fields?: LogFields): void;
  warn(message: string, fields?: LogFields): void;
  error(message: string, fields?: LogFields): void;
  child(fields: LogFields): Logger;
}

function redact(fields: LogFields): LogFields {
  const out: LogFields = {};
  for (const [key, value] of Object.entries(fields)) {
    if (SECRET_KEYS.test(key)) out[key] = '[redacted]';
    else if (value instanceof Error) out[key] = { name: value.name, message: value.message, stack: value.stack };
    else out[key] = value;
  }
  return out;
}

interface LoggerConfig {
  level: Level | 'silent';
  json: boolean;
  write: (line: string, level: Level) => void;
}

function make(config: LoggerConfig, base: LogFields): Logger {
  const emit = (level: Level, message: string, fields: LogFields = {}) => {
    if (ORDER[level] < ORDER[config.level]) return;
    const all = redact({ ...base, ...fields });
    if (config.json) {
      config.write(JSON.stringify({ time: new Date().toISOString(), level, message, ...all }), level);
      return;
    }
    const extras = Object.entries(all)
      .map(([k, v]) => `${k}=${typeof v === 'string' ? v : JSON.stringify(v)}`)
      .join(' ');
    const time = new Date().toISOString().slice(11, 19);
    config.write(`${time} ${level.padEnd(5)} ${message}${extras ? `  ${extras}` : ''}`, level);
  };
  return {
    debug: (m, f) => emit('debug', m, f),
    info: (m, f) => emit('info', m, f),
    warn: (m, f) => emit('warn', m, f),
    error: (m, f) => emit('error', m, f),
    child: (fields) => make(config, { ...base, ...fields }),
  };
}

/**
 * Creates a logger. JSON lines when `json` (production), text otherwise; errors go to stderr.
 * @param level the lowest level written (`silent` writes nothing)
 */
export function createLogger(level: Level | 'silent' = 'info', json = process.env.NODE_ENV === 'production'): Logger {
  return make(
    {
      level,
      json,
      write: (line, lvl) => (lvl === 'error' || lvl === 'warn' ? process.stderr : process.stdout).write(`${line}\n`),
    },
    {},
  );
}

/** A logger that writes nothing (tests). */
export const silentLogger: Logger = createLogger('silent');
