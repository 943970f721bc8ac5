// The importers' supply of commit requests: one distinct export per request, encoded before the run so
// that building files does not slow the load generator; when the supply runs out, more are built on demand.
import { PLATE_PLANS } from '../demo-plates/plate-plans';
import { screenIdsByName } from './discover';
import {
  encodeCommit,
  inspectUpload,
  makeUpload,
  type CommitTarget,
  type EncodedForm,
  type PlateUpload,
} from './plate-uploads';

export interface CommitSource {
  /** The body of the next commit request (a file no earlier request carried). */
  next(): EncodedForm;
  /** How many bodies were encoded before the run. */
  prepared: number;
  /** How many were built during the run because the prepared ones ran out. */
  builtDuringRun(): number;
}

export interface CommitSourceOptions {
  baseUrl: string;
  /** A biologist's session cookie (inspect needs the role). */
  cookie: string;
  prepare: number;
  firstSeed: number;
  tag: string;
}

/** Inspects one export of each demo plan for its sheet and mapping, then encodes `prepare` distinct commits. */
export async function prepareCommits(options: CommitSourceOptions): Promise<CommitSource> {
  const screens = await screenIdsByName(options.baseUrl, options.cookie);
  const targets = new Map<string, CommitTarget>();
  const seen = new Set<string>();
  let n = 0;
  const nextUpload = (): PlateUpload => {
    for (;;) {
      const upload = makeUpload(n, options.firstSeed, options.tag);
      n += 1;
      if (!seen.has(upload.sha256)) {
        seen.add(upload.sha256);
        return upload;
      }
    }
  };
  const encode = (upload: PlateUpload) => encodeCommit(upload, targets.get(upload.plan.file)!);

  const queue: PlateUpload[] = [];
  while (targets.size < PLATE_PLANS.length) {
    const upload = nextUpload();
    queue.push(upload);
    if (targets.has(upload.plan.file)) continue;
    const screenId = screens.get(upload.screen);
    if (!screenId)
      throw new Error(`the import page offers no screen named ${upload.screen}: seed the demo data first`);
    targets.set(upload.plan.file, await inspectUpload(options.baseUrl, options.cookie, upload, screenId));
  }
  const ready = queue.map(encode);
  while (ready.length < options.prepare) {
    ready.push(encode(nextUpload()));
    // Let idle keep-alive sockets close while files are built, so no later request meets a dead one.
    if (ready.length % 25 === 0) await new Promise((resolve) => setImmediate(resolve));
  }

  let taken = 0;
  let built = 0;
  return {
    next() {
      if (taken < ready.length) return ready[taken++]!;
      built += 1;
      return encode(nextUpload());
    },
    prepared: ready.length,
    builtDuringRun: () => built,
  };
}
