// No 'server-only' here: forms show the same limits that the server enforces.

/** Minimum password length for Gatewell accounts (common practice, no source). */
export const MIN_PASSWORD_LENGTH = 10;
/** Longest password accepted, so that hashing cannot be used to tie up the server. */
export const MAX_PASSWORD_LENGTH = 1024;
