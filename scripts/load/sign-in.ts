// Signs a demo user in over HTTP the way a browser without JavaScript does: it reads the sign-in
// page, copies the form's hidden fields (the server action's reference), and posts the form.

/** Demo accounts from seeders/20261201000100-demo-users.js (passwords for the local demo only). */
export const DEMO_ACCOUNTS = [
  { email: 'admin@gatewell.test', password: 'demo-admin-pass' },
  { email: 'chemist@gatewell.test', password: 'demo-chemist-pass' },
  { email: 'biologist@gatewell.test', password: 'demo-biologist-pass' },
  { email: 'approver@gatewell.test', password: 'demo-approver-pass' },
  { email: 'approver2@gatewell.test', password: 'demo-approver2-pass' },
] as const;

export type DemoAccount = (typeof DEMO_ACCOUNTS)[number];

const ENTITIES: Record<string, string> = {
  '&quot;': '"',
  '&#x27;': "'",
  '&#39;': "'",
  '&lt;': '<',
  '&gt;': '>',
  '&amp;': '&',
};

function decodeAttribute(value: string): string {
  return value.replace(/&(quot|#x27|#39|lt|gt|amp);/g, (entity) => ENTITIES[entity] ?? entity);
}

/** The name and value of every hidden input of the page's first form, in order. */
export function hiddenFields(html: string): [string, string][] {
  const form = /<form\b[^>]*>([\s\S]*?)<\/form>/.exec(html)?.[1] ?? '';
  const fields: [string, string][] = [];
  for (const [input] of form.matchAll(/<input\b[^>]*>/g)) {
    if (!/\btype="hidden"/.test(input)) continue;
    const name = /\bname="([^"]*)"/.exec(input)?.[1];
    if (name === undefined) continue;
    fields.push([decodeAttribute(name), decodeAttribute(/\bvalue="([^"]*)"/.exec(input)?.[1] ?? '')]);
  }
  return fields;
}

/** Signs `account` in at `baseUrl` and returns the Cookie header of the new session. */
export async function signIn(baseUrl: string, account: DemoAccount): Promise<string> {
  const page = await fetch(new URL('/sign-in', baseUrl));
  if (!page.ok) throw new Error(`GET /sign-in answered ${page.status}`);
  const fields = hiddenFields(await page.text());
  if (!fields.some(([name]) => name.startsWith('$ACTION')))
    throw new Error('the sign-in page holds no server-action form');
  const form = new FormData();
  for (const [name, value] of fields) form.append(name, value);
  form.append('email', account.email);
  form.append('password', account.password);
  const answer = await fetch(new URL('/sign-in', baseUrl), {
    method: 'POST',
    body: form,
    redirect: 'manual',
    headers: { origin: new URL(baseUrl).origin },
  });
  const session = answer.headers
    .getSetCookie()
    .map((cookie) => cookie.split(';')[0]!)
    .find((pair) => pair.startsWith('gatewell_session='));
  if (answer.status !== 303 || !session)
    throw new Error(`signing in ${account.email} answered ${answer.status} without a session cookie`);
  return session;
}
