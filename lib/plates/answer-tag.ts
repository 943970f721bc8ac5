import 'server-only';
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { NextResponse } from 'next/server';
import type { Actor } from '@/lib/auth/roles';
import { AppError } from '@/lib/errors';
import { processMap } from '@/lib/process-memory';
import { selectPlateAnswerStamp } from './queries';

/** The JSON answers of a plate that carry an entity tag. */
export type PlateAnswer = 'wells' | 'fits';

/**
 * The build the answer's shape comes from: a new build may answer the same rows in another shape, so its
 * id is part of every tag (the process's start time when no build id can be read, as in development).
 */
let build: string | null = null;
function buildId(): string {
  if (build === null) {
    try {
      build = readFileSync(
        path.join(process.cwd(), process.env.GATEWELL_DIST_DIR || '.next', 'BUILD_ID'),
        'utf8',
      ).trim();
    } catch {
      build = `started-${Date.now()}`;
    }
  }
  return build;
}

/**
 * The entity tag of a plate's wells or fits answer, from one indexed read: the plate's content revision
 * (drawn by PostgreSQL triggers with every change to its wells, readouts, fits and the identifiers of its
 * compounds, migrations/20261211001000-plate-content-revisions.js), its version, state and whether fits
 * are pending, and the last change to its screen's targets (names in the answers). Every reader sees the
 * same answer, so the tag does not depend on who asks. A missing plate is `not_found`.
 */
export async function plateAnswerTag(actor: Actor, plateId: string, answer: PlateAnswer): Promise<string> {
  void actor; // every signed-in role may read plates; the route's wrapper checked the session
  const stamp = await selectPlateAnswerStamp(plateId);
  if (!stamp) throw new AppError('not_found', 'No such plate.');
  const digest = createHash('sha256')
    .update(JSON.stringify([answer, buildId(), stamp]))
    .digest('base64url')
    .slice(0, 27);
  return `"${digest}"`;
}

/** Cached by the browser, but asked again each time: a repeat read with the tag answers 304 and no body. */
export const PLATE_ANSWER_CACHE_CONTROL = 'private, no-cache';

/** Whether the request's If-None-Match names the tag (a list, weak or strong, or `*`). */
export function requestHoldsTag(request: Request, tag: string): boolean {
  const held = request.headers.get('if-none-match');
  if (!held) return false;
  return held
    .split(',')
    .map((t) => t.trim().replace(/^W\//, ''))
    .some((t) => t === tag || t === '*');
}

/** 304 Not Modified for a tag the browser holds. */
export function notModified(tag: string): NextResponse {
  return new NextResponse(null, {
    status: 304,
    headers: { etag: tag, 'cache-control': PLATE_ANSWER_CACHE_CONTROL },
  });
}

/** The JSON answer with its tag. */
export function taggedJson(body: unknown, tag: string): NextResponse {
  return NextResponse.json(body, { headers: { etag: tag, 'cache-control': PLATE_ANSWER_CACHE_CONTROL } });
}

/** Most characters of JSON this process keeps for plates' answers (our choice: about 150 wells answers of a 384-well plate). */
export const ANSWER_CACHE_CHARS = 64 * 1024 * 1024;

interface KeptAnswers {
  /** By plate, answer and tag, oldest use first (a Map keeps insertion order; a hit moves to the end). */
  entries: Map<string, Promise<string>>;
  sizes: Map<string, number>;
  chars: number;
}
// One cache per server process, shared by the bundles that import this module.
const keptAnswers = (): KeptAnswers => {
  const store = processMap<'answers', KeptAnswers>('plateAnswers');
  let kept = store.get('answers');
  if (!kept) store.set('answers', (kept = { entries: new Map(), sizes: new Map(), chars: 0 }));
  return kept;
};

/**
 * The JSON answer of a plate under its tag, its text kept in this process's memory: a tag names one
 * answer (the browser's copy under the tag rests on the same promise, see plateAnswerTag), so the next
 * reader of the same plate at the same revision, version and state gets the text the first one built,
 * without the rows being read and written out again; readers arriving together share one build. Kept by
 * plate, answer and tag; a change to the plate draws a new tag, and the old entry is never asked for
 * again and falls out as newer answers fill the cache. The rows are read after the tag, so a write landing
 * between the two keeps a newer answer under the older tag, which nobody asks for once that write is
 * committed (the revision only moves forward). A build that fails is not kept.
 */
export async function keptTaggedJson(
  plateId: string,
  answer: PlateAnswer,
  tag: string,
  build: () => Promise<unknown>,
): Promise<NextResponse> {
  const key = `${plateId}:${answer}:${tag}`;
  const kept = keptAnswers();
  let text = kept.entries.get(key);
  if (text) {
    kept.entries.delete(key);
    kept.entries.set(key, text);
  } else {
    text = build().then((body) => JSON.stringify(body));
    kept.entries.set(key, text);
    text.then(
      (json) => {
        if (kept.entries.get(key) !== text) return;
        kept.sizes.set(key, json.length);
        kept.chars += json.length;
        for (const [oldest] of kept.entries) {
          if (kept.chars <= ANSWER_CACHE_CHARS || oldest === key) break;
          kept.entries.delete(oldest);
          kept.chars -= kept.sizes.get(oldest) ?? 0;
          kept.sizes.delete(oldest);
        }
      },
      () => {
        if (kept.entries.get(key) === text) kept.entries.delete(key);
      },
    );
  }
  return new NextResponse(await text, {
    headers: {
      'content-type': 'application/json',
      etag: tag,
      'cache-control': PLATE_ANSWER_CACHE_CONTROL,
    },
  });
}
