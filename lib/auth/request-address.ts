import 'server-only';
import { headers } from 'next/headers';

/** The client address of the current request (first X-Forwarded-For hop behind a proxy, else loopback). */
export async function requestAddress(): Promise<string> {
  const list = await headers();
  const forwarded = list.get('x-forwarded-for')?.split(',')[0]?.trim();
  return forwarded || list.get('x-real-ip') || '127.0.0.1';
}
