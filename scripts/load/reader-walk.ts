// What a reader's browser asks Gatewell for while walking plates, as headless Chromium was seen to ask
// it (Dec 2026, Next.js 16): the plate list opened as a document, then client-side navigations through
// the app's links, each an RSC request carrying the router's state tree and the page it comes from,
// and the JSON the pages fetch. `documents: true` opens every page as a document instead (a browser
// reloading at each step), which costs the server more per page.
import type { ScheduledRequest } from './run-people';

export type Read = Pick<ScheduledRequest, 'route' | 'path' | 'headers'>;

/** The router state tree the client sends, for a tree below the plates segment. */
function stateTree(inPlates: unknown): string {
  return JSON.stringify([
    '',
    { children: ['(app)', { children: ['plates', { children: inPlates }, null, null, 0] }, null, null, 4] },
    null,
    null,
    24,
  ]);
}
const page = (refetch = false) => ['__PAGE__', {}, null, refetch ? 'refetch' : null, 0];
const onPlate = (plateId: string, tab: string | null) =>
  stateTree([
    ['plateId', plateId, 'd', null],
    { children: tab ? [tab, { children: page() }, null, null, 0] : page() },
    null,
    null,
    0,
  ]);

interface Navigation {
  route: string;
  path: string;
  /** The state tree of the page the browser is on (as the client router sends it). */
  tree: string;
  from: string;
}

/** The four navigations of one plate: list → plate → fits tab → history tab → list. */
function navigations(plateId: string): Navigation[] {
  const plate = `/plates/${plateId}`;
  return [
    { route: 'nav /plates/[id]', path: plate, tree: stateTree(page()), from: '/plates' },
    { route: 'nav /plates/[id]/fits', path: `${plate}/fits`, tree: onPlate(plateId, null), from: plate },
    {
      route: 'nav /plates/[id]/history',
      path: `${plate}/history`,
      tree: onPlate(plateId, 'fits'),
      from: `${plate}/fits`,
    },
    { route: 'nav /plates', path: '/plates', tree: stateTree(page(true)), from: `${plate}/history` },
  ];
}

/**
 * The RSC request of a navigation. Next.js answers a request whose `_rsc` search parameter does not
 * match its headers with a redirect to the right one; the first answer is followed once to learn it.
 */
async function navigationRead(baseUrl: string, cookie: string, navigation: Navigation): Promise<Read> {
  const headers = {
    rsc: '1',
    'next-router-state-tree': encodeURIComponent(navigation.tree),
    'next-url': navigation.from,
  };
  const probe = await fetch(new URL(`${navigation.path}?_rsc=0`, baseUrl), {
    headers: { ...headers, cookie },
    redirect: 'manual',
  });
  await probe.arrayBuffer();
  const location = probe.headers.get('location');
  const path =
    probe.status === 200
      ? `${navigation.path}?_rsc=0`
      : location && new URL(location, baseUrl).pathname === navigation.path
        ? new URL(location, baseUrl).pathname + new URL(location, baseUrl).search
        : null;
  if (!path)
    throw new Error(
      `the navigation to ${navigation.path} answered ${probe.status}${location ? ` (to ${location})` : ''}`,
    );
  return { route: navigation.route, path, headers };
}

/** Each plate in turn: list, plate page with its jobs and wells, fits tab with its fits, history tab. */
export async function readerWalk(
  baseUrl: string,
  cookie: string,
  plateIds: string[],
  options: { documents: boolean },
): Promise<Read[]> {
  const reads: Read[][] = [];
  for (const plateId of plateIds) {
    reads.push(
      options.documents
        ? navigations(plateId).map((n) => ({ route: n.route.replace(/^nav /, 'GET '), path: n.path }))
        : await Promise.all(navigations(plateId).map((n) => navigationRead(baseUrl, cookie, n))),
    );
  }
  return plateIds.flatMap((plateId, i) => {
    const [toPlate, toFits, toHistory] = reads[i]!;
    const api = (what: string): Read => ({
      route: `GET /api/plates/[id]/${what}`,
      path: `/api/plates/${plateId}/${what}`,
    });
    // The walk starts (and starts again after the last plate) where a person opening Gatewell starts: the
    // plate list as a document; between plates it navigates back from the history tab to the list.
    const list: Read =
      i === 0 || options.documents ? { route: 'GET /plates', path: '/plates' } : reads[i - 1]![3]!;
    return [list, toPlate!, api('jobs'), api('wells'), toFits!, api('fits'), toHistory!];
  });
}
