/** A small levelled logger to stderr; structured enough for a plant's log collector. */
type Level = 'debug' | 'info' | 'warn' | 'error';
const order: Record<Level | 'silent', number> = { debug: 10, info: 20, warn: 30, error: 40, silent: 99 };
let threshold = order[(process.env.LOG_LEVEL as Level | undefined) ?? 'info'] ?? order.info;

export function setLogLevel(level: Level | 'silent'): void {
  threshold = order[level];
}

function write(level: Level, message: string, fields?: Record<string, unknown>): void {
  if (order[level] < threshold) return;
  const extra = fields ? ` ${JSON.stringify(fields)}` : '';
  process.stderr.write(`${new Date().toISOString()} ${level.toUpperCase()} ${message}${extra}\n`);
}

export const logger = {
  debug: (message: string, fields?: Record<string, unknown>) => write('debug', message, fields),
  info: (message: string, fields?: Record<string, unknown>) => write('info', message, fields),
  warn: (message: string, fields?: Record<string, unknown>) => write('warn', message, fields),
  error: (message: string, fields?: Record<string, unknown>) => write('error', message, fields),
};
