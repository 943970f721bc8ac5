// Gatewell plate import from the command line, for automation:
//   node --conditions=react-server --import tsx scripts/import-plate.ts FILE --screen NAME|ID --as EMAIL
//        [--template NAME|ID | --mapping FILE.json] [--label L] [--dry-run] [--json] [--offline]
// Reads the file once (the same worker-thread parser as the app), maps it with the mapping file given (a
// saved template's mapping as JSON, lib/imports/mapping-schema.ts), else the template named, else the
// template whose header fingerprint the file shows, else the guessed mapping, and checks it as the
// check step does. Without --dry-run it stores the plate when the check finds no error, through the same
// service as POST /api/imports/plate (lib/plates/import-once.ts), committed in this process.
// --offline needs no database: no templates (the guessed mapping, or --mapping), no registry
// (unregisteredCompounds is null, every compound and target of the file is taken as known, QC at the
// default limits); it implies --dry-run.
// A file of several plates (a sheet per plate, a plate column) is stored as a plate each, all or none.
// Exit codes: 0 checked clean (and stored), 1 problems found (or refused), 2 bad arguments.
import { readFileSync } from 'node:fs';
import { basename } from 'node:path';
import { parseArgs } from 'node:util';
import { z } from 'zod';
import { issuePath, readJsonFile } from './cli-input';
import { columnMappingSchema, type ColumnMapping } from '../lib/imports/mapping-schema';
import { parseSpreadsheet } from '../lib/imports/parse-spreadsheet';
import {
  guessSheet,
  offlineFileFacts,
  unreadFileFacts,
  plateLabel,
  type FileImportFacts,
  sheetForMapping,
} from '../lib/plates/import-facts';

const USAGE = `usage: node --conditions=react-server --import tsx scripts/import-plate.ts FILE --screen NAME|ID [options]

Reads a plate export, checks it as the import's check step does, and stores the plate when the check is clean.

  --screen NAME|ID    the screen the plate belongs to (required unless --offline)
  --as EMAIL          the account that imports: an enabled account allowed to import plates (a biologist);
                      required unless --offline. Needs DATABASE_URL (and the app's other settings).
  --template NAME|ID  apply this saved import template (else the template whose header fingerprint the
                      file shows, else the guessed mapping)
  --mapping FILE.json apply this column mapping, written as a saved template's mapping (docs/imports.md,
                      Column mapping); its wellSheet, else the sheet the guess chooses (not with --template)
  --label L           the plate's label (else the barcode found in the file, else the file's name)
  --dry-run           check only; store nothing
  --json              print one JSON object (the check's facts; plateId when stored); \`plates\` lists
                      every plate of the file with its facts (plateLabel, wellCount, roleCounts, …);
                      \`readouts\` lists each target's block readouts (["tonic"], or ["tonic",
                      "use_dependent"] when the mapping maps a use-dependent block)
  --offline           no database: the guessed mapping or --mapping, no registry (implies --dry-run;
                      not with --template)
  --help              this text

A file may hold several plates (a sheet per plate, or a plate column): each is stored as a plate of its
own, all or none, labelled by its barcode, sheet name or plate-column value (--label then goes unused).
The top-level keys are then the first plate's (sheet, plateLabel, wellCount, roleCounts, …), except
errors, warnings and unregisteredCompounds, which are the whole file's, each naming its plate;
plateCount says how many plates there are.

Exit codes: 0 clean (and stored), 1 problems found or the import refused, 2 bad arguments.`;

const argsSchema = z
  .object({
    file: z.string().min(1),
    screen: z.string().trim().min(1).optional(),
    as: z.email('must be an e-mail address').optional(),
    template: z.string().trim().min(1).optional(),
    mapping: z.string().min(1).optional(),
    label: z.string().trim().min(1).max(120, 'must be at most 120 characters').optional(),
    dryRun: z.boolean(),
    json: z.boolean(),
    offline: z.boolean(),
  })
  .superRefine((args, ctx) => {
    if (args.offline && args.template)
      ctx.addIssue({
        code: 'custom',
        path: ['template'],
        message: 'templates are kept in the database: not with --offline',
      });
    if (args.mapping && args.template)
      ctx.addIssue({ code: 'custom', path: ['mapping'], message: 'a mapping file or a template, not both' });
    if (!args.offline && !args.screen)
      ctx.addIssue({ code: 'custom', path: ['screen'], message: 'is required (or --offline)' });
    if (!args.offline && !args.as)
      ctx.addIssue({ code: 'custom', path: ['as'], message: 'is required (or --offline)' });
  });
type Args = z.infer<typeof argsSchema> & { columnMapping?: ColumnMapping };

/** The command line checked; null (with the reason on stderr) when it is not usable. */
function readArgs(argv: readonly string[]): Args | 'help' | null {
  let parsed;
  try {
    parsed = parseArgs({
      args: [...argv],
      allowPositionals: true,
      options: {
        screen: { type: 'string' },
        as: { type: 'string' },
        template: { type: 'string' },
        mapping: { type: 'string' },
        label: { type: 'string' },
        'dry-run': { type: 'boolean', default: false },
        json: { type: 'boolean', default: false },
        offline: { type: 'boolean', default: false },
        help: { type: 'boolean', default: false },
      },
    });
  } catch (error) {
    process.stderr.write(`import-plate: ${(error as Error).message}\n${USAGE}\n`);
    return null;
  }
  if (parsed.values.help) return 'help';
  if (parsed.positionals.length !== 1) {
    process.stderr.write(`import-plate: name exactly one FILE\n${USAGE}\n`);
    return null;
  }
  const { values } = parsed;
  const checked = argsSchema.safeParse({
    file: parsed.positionals[0],
    screen: values.screen,
    as: values.as,
    template: values.template,
    mapping: values.mapping,
    label: values.label,
    dryRun: values['dry-run'] || values.offline,
    json: values.json,
    offline: values.offline,
  });
  if (!checked.success) {
    const lines = checked.error.issues.map((i) => `  --${issuePath(i.path)}: ${i.message}`);
    process.stderr.write(`import-plate: bad arguments:\n${lines.join('\n')}\n`);
    return null;
  }
  if (!checked.data.mapping) return checked.data;
  const mapping = readJsonFile(checked.data.mapping, columnMappingSchema, 'mapping');
  if (mapping.ok) return { ...checked.data, columnMapping: mapping.data };
  process.stderr.write(`import-plate: --mapping: ${mapping.message}\n`);
  return null;
}

/** The file's bytes, or null (with the reason on stderr). */
function readBytes(file: string): Uint8Array | null {
  try {
    return new Uint8Array(readFileSync(file));
  } catch (error) {
    process.stderr.write(
      `import-plate: cannot read ${file}: ${(error as NodeJS.ErrnoException).code ?? String(error)}\n`,
    );
    return null;
  }
}

/** The check with no database: parse, map (given or guessed), validate with every compound and target known. */
async function checkOffline(bytes: Uint8Array, filename: string, args: Args) {
  const { label, columnMapping } = args;
  const parsed = await parseSpreadsheet(bytes, filename);
  if (!parsed.ok) return { refused: parsed.error.message };
  if (parsed.sheets.length === 0) return { refused: `${filename} holds no sheets.` };
  const chosen = columnMapping ? sheetForMapping(parsed.sheets, columnMapping) : guessSheet(parsed.sheets);
  if ('refused' in chosen) return { refused: chosen.refused };
  const { sheet, mapping } = chosen;
  return {
    facts: offlineFileFacts({ filename, sheets: parsed.sheets, sheet, mapping, givenLabel: label }),
  };
}

/** The acting account by e-mail, with its roles; null when there is no such enabled account. */
async function actorByEmail(email: string) {
  const { db } = await import('../lib/db');
  const { User } = await import('../models');
  const { loadActor } = await import('../lib/auth/load-actor');
  db();
  const user = await User.findOne({ where: { email: email.toLowerCase() } });
  const actor = user && (await loadActor(user.id, '127.0.0.1'));
  if (!actor) return null;
  const { sessionVersion: _version, ...rest } = actor;
  return rest;
}

type Outcome = {
  facts?: FileImportFacts;
  refused?: string;
  plateId?: string;
  plates?: { plateId: string; label: string }[];
};

/** The check (and store) with the database, through lib/plates/import-once.ts. */
async function checkOnline(args: Args, bytes: Uint8Array, filename: string): Promise<Outcome> {
  const { isAppError } = await import('../lib/errors');
  const { checkImportOnce, importOnce } = await import('../lib/plates/import-once');
  const actor = await actorByEmail(args.as!);
  if (!actor) return { refused: `no enabled account with the e-mail ${args.as}` };
  const request = {
    screen: args.screen!,
    template: args.template,
    mapping: args.columnMapping,
    label: args.label,
    file: { bytes, filename, mediaType: 'application/octet-stream' },
  };
  try {
    if (args.dryRun) return { facts: (await checkImportOnce(actor, request)).facts };
    const result = await importOnce(actor, request, { via: 'here' });
    return {
      facts: result.facts,
      ...(result.state === 'stored' ? { plateId: result.plateId, plates: result.plates } : {}),
    };
  } catch (error) {
    if (!isAppError(error)) throw error;
    const details = error.details as { facts?: FileImportFacts } | undefined;
    return { refused: error.message, ...(details?.facts ? { facts: details.facts } : {}) };
  }
}

/** The facts of a file that could not be checked at all: no wells, the refusal as its one error. */
function unreadFacts(args: Args, filename: string, refused: string, offline: boolean): FileImportFacts {
  const label = plateLabel(args.label, {}, filename);
  return unreadFileFacts({ filename, sheet: '', template: null, label, errors: [refused], offline });
}

function report(args: Args, filename: string, outcome: Outcome): number {
  const { refused, plateId } = outcome;
  const facts = outcome.facts ?? (refused ? unreadFacts(args, filename, refused, args.offline) : undefined);
  const problems = Boolean(refused) || !facts || facts.errors.length > 0;
  if (args.json) {
    // Each stored plate's id goes beside its facts in `plates`; plateId is the first plate's.
    const plates = facts?.plates.map((plate, i) => ({
      ...plate,
      ...(outcome.plates?.[i] ? { plateId: outcome.plates[i].plateId } : {}),
    }));
    const out = {
      ...(facts ?? {}),
      ...(plates ? { plates } : {}),
      ...(refused ? { refused } : {}),
      ...(plateId ? { plateId } : {}),
    };
    process.stdout.write(`${JSON.stringify(out, null, 2)}\n`);
    return problems ? 1 : 0;
  }
  const lines: string[] = [];
  // A file that could not be checked at all is told by its refusal alone.
  if (facts && outcome.facts) {
    const r = facts.roleCounts;
    lines.push(
      `${facts.file}, sheet "${facts.sheet}"${facts.template ? `, template ${facts.template}` : args.mapping ? `, mapping ${args.mapping}` : ', guessed mapping'}`,
      `plate ${facts.plateLabel} (label from the ${facts.labelSource}), ${facts.wellCount} wells` +
        `${facts.plateFormat ? ` on a ${facts.plateFormat}-well plate` : ''}: ${r.negativeControl} negative control, ` +
        `${r.positiveControl} positive control, ${r.test} test, ${r.empty} empty`,
      `targets ${facts.targets.join(', ') || '(none)'}; concentrations in ${facts.concentrationUnit}`,
    );
    if (facts.unregisteredCompounds?.length)
      lines.push(`not registered: ${facts.unregisteredCompounds.join(', ')}`);
    // A file of several plates: the first plate above, each plate in a line of its own.
    if (facts.plateCount > 1)
      for (const plate of facts.plates)
        lines.push(
          `  plate ${plate.plateLabel} (${plate.labelSource} ${plate.key}): ${plate.wellCount} wells, ${plate.errors.length} error(s)`,
        );
    for (const warning of facts.warnings) lines.push(`warning: ${warning}`);
    for (const error of facts.errors) lines.push(`error: ${error}`);
  }
  if (refused && !outcome.facts?.errors.includes(refused)) lines.push(`refused: ${refused}`);
  if (outcome.plates && outcome.plates.length > 1)
    for (const plate of outcome.plates) lines.push(`stored as plate ${plate.label} (${plate.plateId})`);
  else if (plateId) lines.push(`stored as plate ${facts?.plateLabel ?? ''} (${plateId})`);
  else if (!problems) lines.push(args.dryRun ? 'checked clean; nothing stored (dry run)' : 'checked clean');
  process.stdout.write(`${lines.join('\n')}\n`);
  return problems ? 1 : 0;
}

async function main(argv: readonly string[]): Promise<number> {
  const args = readArgs(argv);
  if (args === 'help') {
    process.stdout.write(`${USAGE}\n`);
    return 0;
  }
  if (!args) return 2;
  const bytes = readBytes(args.file);
  if (!bytes) return 2;
  const filename = basename(args.file);
  if (args.offline) return report(args, filename, await checkOffline(bytes, filename, args));
  try {
    return report(args, filename, await checkOnline(args, bytes, filename));
  } finally {
    // The commit queued the plate's fit job through the job queue: close it and the database so the process ends.
    const { closeJobQueue } = await import('../lib/jobs/queue');
    const { db } = await import('../lib/db');
    await closeJobQueue();
    await db().close();
  }
}

main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (error: unknown) => {
    process.stderr.write(
      `import-plate: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`,
    );
    process.exitCode = 1;
  },
);
