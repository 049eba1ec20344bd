/**
 * A small structured log writer (a "logger" in Lagbook is the data logger): one JSON line per event on stdout/stderr, so operators can
 * grep and ship logs. Callers pass facts, never secrets (keys, tokens, cookies).
 */
export interface LogWriter {
  info(msg: string, fields?: Record<string, unknown>): void;
  warn(msg: string, fields?: Record<string, unknown>): void;
  error(msg: string, fields?: Record<string, unknown>): void;
}

/** Writes JSON lines; `silent` drops info lines (tests keep their output readable). */
export function createLogWriter({ silent = false }: { silent?: boolean } = {}): LogWriter {
  const write = (level: string, stream: NodeJS.WriteStream, msg: string, fields?: Record<string, unknown>) =>
    stream.write(`${JSON.stringify({ t: new Date().toISOString(), level, msg, ...fields })}\n`);
  return {
    info: (msg, fields) => {
      if (!silent) write('info', process.stdout, msg, fields);
    },
    warn: (msg, fields) => write('warn', process.stderr, msg, fields),
    error: (msg, fields) => write('error', process.stderr, msg, fields),
  };
}
