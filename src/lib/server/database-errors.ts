/** Error codes of a database that is unreachable or went away (Node's sockets, mysql2 and MariaDB). */
const UNREACHABLE = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EPIPE',
  'EHOSTUNREACH',
  'ENETUNREACH',
  'EAI_AGAIN',
  'PROTOCOL_CONNECTION_LOST',
  'PROTOCOL_SEQUENCE_TIMEOUT',
  'ER_SERVER_SHUTDOWN',
  'ER_CON_COUNT_ERROR',
  'ER_CONNECTION_KILLED',
]);

interface Failure {
  code?: unknown;
  fatal?: unknown;
  cause?: unknown;
  errors?: unknown;
}

/** True when an error, or one it wraps (Drizzle's query error, Node's AggregateError), says the database could not be reached. */
export function isDatabaseUnreachable(error: unknown, depth = 0): boolean {
  if (!error || typeof error !== 'object' || depth > 5) return false;
  const failure = error as Failure;
  if (typeof failure.code === 'string' && UNREACHABLE.has(failure.code)) return true;
  // mysql2 marks errors that ended the connection (e.g. "Can't add new command when connection is in closed state").
  if (failure.fatal === true) return true;
  if (Array.isArray(failure.errors) && failure.errors.some((inner) => isDatabaseUnreachable(inner, depth + 1))) return true;
  return isDatabaseUnreachable(failure.cause, depth + 1);
}
