/**
 * Whether an error means PostgreSQL cannot be reached (stopped, restarting, refusing
 * connections) rather than a bug: such requests answer 503 with a retry hint, not 500.
 */
const networkCodes = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EHOSTUNREACH',
  'ENETUNREACH',
  'EPIPE',
  'ENOTFOUND',
  'EAI_AGAIN',
]);

// SQLSTATE values from PostgreSQL's "Appendix A. Error Codes": class 08 (connection
// exception), 57P01 admin_shutdown, 57P02 crash_shutdown, 57P03 cannot_connect_now,
// 53300 too_many_connections.
const unavailableStates = new Set(['57P01', '57P02', '57P03', '53300']);

// node-postgres reports a connection dropped mid-query with these plain messages.
const droppedConnection = /^Connection terminated|^Client has encountered a connection error/;

/** Seconds a client should wait before trying again. */
export const DATABASE_RETRY_AFTER_SECONDS = 5;

export function isDatabaseUnavailable(error: unknown, depth = 0): boolean {
  if (typeof error !== 'object' || error === null || depth > 4) return false;
  const code = (error as { code?: unknown }).code;
  if (typeof code === 'string') {
    if (networkCodes.has(code) || unavailableStates.has(code) || code.startsWith('08')) {
      return true;
    }
  }
  if (error instanceof Error && droppedConnection.test(error.message)) return true;
  if (error instanceof AggregateError) {
    return error.errors.some((inner) => isDatabaseUnavailable(inner, depth + 1));
  }
  return isDatabaseUnavailable((error as { cause?: unknown }).cause, depth + 1);
}
