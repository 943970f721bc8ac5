// What the load reads and writes to, found the way a person finds it: from the pages themselves.

const UUID = '[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}';

async function page(baseUrl: string, path: string, cookie: string): Promise<string> {
  const answer = await fetch(new URL(path, baseUrl), { headers: { cookie }, redirect: 'manual' });
  if (answer.status !== 200) throw new Error(`GET ${path} answered ${answer.status}`);
  return answer.text();
}

/** The ids of the plates on the plate list, in the list's order (newest first). */
export async function listedPlateIds(baseUrl: string, cookie: string): Promise<string[]> {
  const html = await page(baseUrl, '/plates', cookie);
  return [
    ...new Set([...html.matchAll(new RegExp(`href="/plates/(${UUID})"`, 'g'))].map((match) => match[1]!)),
  ];
}

/** Screen ids by name, from the screen menu of the import page (a biologist's cookie). */
export async function screenIdsByName(baseUrl: string, cookie: string): Promise<Map<string, string>> {
  const html = await page(baseUrl, '/plates/import', cookie);
  const options = html.matchAll(new RegExp(`<option value="(${UUID})"[^>]*>([^<]+)`, 'g'));
  return new Map([...options].map((match) => [match[2]!.trim(), match[1]!]));
}
