import { unsealData } from 'iron-session';
import { processMap } from '@/lib/process-memory';
import { sessionOptions, type SessionData } from './session-config';

// No 'server-only': the proxy reads sessions through this too. Unsealing costs about a millisecond of CPU
// (key derivation, decryption and MAC through WebCrypto), and each request unsealed its cookie twice, in the
// proxy and in the page or route. A cookie unsealed in the last minute is read from this process's memory
// instead: the same sealed text always holds the same data, only cookies that unsealed are kept, and the
// caller still checks the session's idle and absolute lifetimes (sessionIsFresh) on every request.
const KEEP_MS = 60_000;
const MAX_ENTRIES = 5000;

interface Unsealed {
  data: SessionData;
  until: number;
}

const unsealed = () => processMap<string, Unsealed>('unsealedSessions');

/** The data in a sealed session cookie, or {} when there is none or it does not unseal (forged, expired, other secret). */
export async function readSealedSession(sealed: string | undefined, now = Date.now()): Promise<SessionData> {
  if (!sealed) return {};
  const cache = unsealed();
  const hit = cache.get(sealed);
  if (hit && hit.until > now) return { ...hit.data };
  const options = sessionOptions();
  let data: SessionData;
  try {
    data = await unsealData<SessionData>(sealed, { password: options.password, ttl: options.ttl ?? 0 });
  } catch {
    return {};
  }
  if (hit) cache.delete(sealed);
  cache.set(sealed, { data: { ...data }, until: now + KEEP_MS });
  if (cache.size > MAX_ENTRIES) cache.delete(cache.keys().next().value!);
  return data;
}
