/** Error codes that mean "PostgreSQL cannot be reached", not "this query is wrong". */
const NETWORK_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'ENOTFOUND']);
// SQLSTATE class 08 (connection exception) and 57P0x (server shutting down / restarting).
const SQLSTATE = /^(08\d{3}|57P0[1-4])$/;
const MESSAGES = /Connection terminated|timeout exceeded when trying to connect|Client has encountered a connection error|Connection is not established/i;

/** True when an error (possibly wrapped by TypeORM) means the database is unreachable. */
export function isDatabaseDown(err: unknown): boolean {
  for (let e: unknown = err, depth = 0; e && typeof e === 'object' && depth < 4; depth++) {
    const { code, message } = e as { code?: unknown; message?: unknown };
    if (typeof code === 'string' && (NETWORK_CODES.has(code) || SQLSTATE.test(code))) return true;
    if (typeof message === 'string' && MESSAGES.test(message)) return true;
    e = (e as { driverError?: unknown; cause?: unknown }).driverError ?? (e as { cause?: unknown }).cause;
  }
  return false;
}
