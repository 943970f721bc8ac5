// The scale fill: a year of invented plates in a database of its own, written server-side with
// `INSERT … SELECT` from a few templates analysed by Gatewell's own science (scripts/scale/templates.ts).
// It writes through the real schema, as the app's role or the owner, with every trigger and constraint on:
// plates are written as imported, then signed step by step (signatures over the plate content's SHA-256,
// worked out by lib/signoff/plate-content.ts as the app works it out, sign-off events whose duty trigger
// checks each round, audit events), and only then moved to their final state. Invented data, not measurements.
import pg from 'pg';
import { db } from '@/lib/db';
import { loadActor } from '@/lib/auth/load-actor';
import { createScreen, addTarget } from '@/lib/screens/service';
import { screenSchema } from '@/lib/validation/screens';
import { plateContentSha256 } from '@/lib/signoff/plate-content';
import { SIGNOFF_STEPS } from '@/lib/signoff/steps';
import { listPlateForecasts, getPlateForecast } from '@/lib/forecasts/plate-forecast';
import { COMPOUND_SLOTS, makeTemplate, SCALE_SCREEN_LIMITS, type PlateTemplate } from './templates';

export interface FillOptions {
  plates: number;
  compounds: number;
  screens: number;
  templates: number;
  /** Plates written per transaction. */
  batch: number;
  /** Forecasts computed through the forecast service on approved plates. */
  forecasts: number;
  /** Connections working out content hashes side by side. */
  hashConcurrency: number;
  /** Connections writing batches of plates side by side. */
  writers: number;
  /** Tells every id and name of this fill apart from an earlier one in the same database. */
  tag: string;
  /** Sign-off paths in turn (plate n takes path n mod length) instead of the year's mix; for tests. */
  paths?: SignoffPath[];
  log: (line: string) => void;
}

export interface FillResult {
  plateIds: string[];
  compoundIds: string[];
  screenIds: string[];
  approverIds: string[];
  seconds: Record<string, number>;
}

export type SignoffPath =
  'imported' | 'verified' | 'submitted' | 'approved' | 'rejected' | 'reopened' | 'reworked';

/**
 * Paths through sign-off, each a list of steps (lib/signoff/steps.ts). `decider` 0 or 1 picks the first
 * or second approver; a rework starts round 1, in which the other approver decides.
 */
export const PATHS: Record<SignoffPath, { action: keyof typeof SIGNOFF_STEPS; decider?: 0 | 1 }[]> = {
  imported: [],
  verified: [{ action: 'verify' }],
  submitted: [{ action: 'verify' }, { action: 'submit' }],
  approved: [{ action: 'verify' }, { action: 'submit' }, { action: 'approve', decider: 0 }],
  rejected: [{ action: 'verify' }, { action: 'submit' }, { action: 'reject', decider: 0 }],
  reopened: [
    { action: 'verify' },
    { action: 'submit' },
    { action: 'reject', decider: 0 },
    { action: 'rework' },
  ],
  reworked: [
    { action: 'verify' },
    { action: 'submit' },
    { action: 'reject', decider: 0 },
    { action: 'rework' },
    { action: 'verify' },
    { action: 'submit' },
    { action: 'approve', decider: 1 },
  ],
};

const REJECT_COMMENTS = [
  'Z′ of the second target is below the screen limit; repeat the plate.',
  'Vehicle run-down is high in columns 1–2; check the rig and repeat.',
  'Reference wells show incomplete block; the reference stock may be old.',
];

async function usersWithRole(client: pg.Client, role: string): Promise<string[]> {
  const { rows } = await client.query<{ id: string }>(
    `select u.id from users u join user_roles r on r.user_id = u.id
      where r.role = $1 and u.disabled_at is null order by u.email`,
    [role],
  );
  return rows.map((r) => r.id);
}

/** Importers (biologists), verifiers (chemists) and deciders (approvers): different people, as sign-off needs. */
async function people(client: pg.Client) {
  const biologists = await usersWithRole(client, 'biologist');
  const chemists = (await usersWithRole(client, 'chemist')).filter((id) => !biologists.includes(id));
  const approvers = (await usersWithRole(client, 'approver')).filter(
    (id) => !biologists.includes(id) && !chemists.includes(id),
  );
  const admins = await usersWithRole(client, 'admin');
  if (!biologists.length || !chemists.length || !approvers.length || !admins.length)
    throw new Error(
      'the fill needs an admin, a biologist, a chemist and an approver, each a different person (seed the demo users first)',
    );
  return {
    biologists,
    chemists,
    approvers: [approvers[0]!, approvers[1] ?? approvers[0]!],
    admin: admins[0]!,
  };
}

async function timed<T>(seconds: Record<string, number>, name: string, work: () => Promise<T>): Promise<T> {
  const start = performance.now();
  try {
    return await work();
  } finally {
    seconds[name] = (performance.now() - start) / 1000;
  }
}

/** Screens with two targets each, through Gatewell's screen service (and its audit events). */
async function makeScreens(adminId: string, count: number, tag: string): Promise<string[]> {
  const admin = await loadActor(adminId, '127.0.0.1');
  if (!admin) throw new Error('the admin cannot sign in');
  const kinds = [
    { what: 'sodium', conductance: 'gNa', targets: ['Nav-a', 'Nav-b'] },
    { what: 'delayed-rectifier potassium', conductance: 'gK', targets: ['Kdr-a', 'Kdr-b'] },
    { what: 'M-type potassium', conductance: 'gM', targets: ['KM-a', 'KM-b'] },
  ];
  const ids: string[] = [];
  for (let i = 0; i < count; i++) {
    const kind = kinds[i % kinds.length]!;
    const input = screenSchema.parse({
      name: `Scale ${tag} screen ${i + 1} (${kind.what})`,
      description: `Invented scale data: ${kind.what} targets, plates of a year.`,
      neuronPreset: 'pospischil-rs-2008',
      zPrimeMin: SCALE_SCREEN_LIMITS.zPrimeMin,
      sealResistanceMin_GOhm: SCALE_SCREEN_LIMITS.sealResistanceMin_GOhm,
      controlCurrentMin_pA: SCALE_SCREEN_LIMITS.controlCurrentMin_pA,
      seriesResistanceMax_MOhm: SCALE_SCREEN_LIMITS.seriesResistanceMax_MOhm,
      capacitanceMin_pF: SCALE_SCREEN_LIMITS.capacitanceMin_pF,
      capacitanceMax_pF: SCALE_SCREEN_LIMITS.capacitanceMax_pF,
      vehicleRundownMax_percent: 100 * SCALE_SCREEN_LIMITS.vehicleRundownMax_fraction,
      exposures_uM: '0.1, 0.3, 1, 3',
    });
    const { id } = await createScreen(admin, input);
    for (const name of kind.targets)
      await addTarget(admin, id, { name: `${name}${i + 1}`, conductance: kind.conductance, description: '' });
    ids.push(id);
  }
  return ids;
}

/** The session's work tables: templates, compounds, targets and the plan of every plate. */
async function workTables(
  client: pg.Client,
  options: FillOptions,
  templates: PlateTemplate[],
  screenIds: string[],
  who: Awaited<ReturnType<typeof people>>,
) {
  for (const statement of `
    create unlogged table fill_template_wells (template int, position text, row_index smallint, column_index smallint, role text,
      slot int, concentration_um double precision, seal_resistance_gohm double precision, series_resistance_mohm double precision, capacitance_pf double precision);
    create unlogged table fill_template_readouts (template int, position text, target_slot int, control_current_pa double precision,
      compound_current_pa double precision, fractional_block double precision, qc_reasons jsonb);
    create unlogged table fill_template_fits (template int, slot int, target_slot int, model text, status text, message text, ic50_um double precision,
      ic50_ci_low_um double precision, ic50_ci_high_um double precision, ic50_lower_bound_um double precision, log10_ic50_se double precision,
      hill double precision, top double precision, bottom double precision, r2 double precision, residual_sd double precision, n int, flags jsonb, estimate jsonb);
    create unlogged table fill_template_summary (template int, summary text);
    create unlogged table fill_hashes (plate_id uuid primary key, sha char(64))`.split(';'))
    await client.query(statement);
  for (const [t, template] of templates.entries()) {
    await client.query(
      `insert into fill_template_wells select $1, * from jsonb_to_recordset($2::jsonb) as x(position text, row_index smallint,
         column_index smallint, role text, slot int, concentration_um double precision, seal_resistance_gohm double precision,
         series_resistance_mohm double precision, capacitance_pf double precision)`,
      [t, JSON.stringify(template.wells)],
    );
    await client.query(
      `insert into fill_template_readouts select $1, * from jsonb_to_recordset($2::jsonb) as x(position text, target_slot int,
         control_current_pa double precision, compound_current_pa double precision, fractional_block double precision, qc_reasons jsonb)`,
      [t, JSON.stringify(template.readouts)],
    );
    await client.query(
      `insert into fill_template_fits select $1, * from jsonb_to_recordset($2::jsonb) as x(slot int, target_slot int, model text,
         status text, message text, ic50_um double precision, ic50_ci_low_um double precision, ic50_ci_high_um double precision,
         ic50_lower_bound_um double precision, log10_ic50_se double precision, hill double precision, top double precision,
         bottom double precision, r2 double precision, residual_sd double precision, n int, flags jsonb, estimate jsonb)`,
      [t, JSON.stringify(template.fits)],
    );
    await client.query('insert into fill_template_summary values ($1, $2)', [
      t,
      JSON.stringify(template.qcSummary),
    ]);
  }
  // Targets of each screen by slot (their creation order).
  await client.query(
    `create unlogged table fill_targets as
       select s.idx - 1 as screen_idx, (row_number() over (partition by t.screen_id order by t.created_at, t.name) - 1)::int as slot, t.id
         from unnest($1::uuid[]) with ordinality as s(id, idx) join targets t on t.screen_id = s.id`,
    [screenIds],
  );
  await client.query(
    `create unlogged table fill_screens as select idx - 1 as screen_idx, id from unnest($1::uuid[]) with ordinality as s(id, idx)`,
    [screenIds],
  );
  // The plan: plate n of N, oldest first over the past year; the newest still in sign-off, the rest mostly approved.
  await client.query(
    `create unlogged table fill_plates as
       select n, overlay(overlay(md5($1 || ':plate:' || n) placing '4' from 13) placing '8' from 17)::uuid as id, overlay(overlay(md5($1 || ':file:' || n) placing '4' from 13) placing '8' from 17)::uuid as file_id,
              (n % $3::int)::int as screen_idx, ((n * 7) % $4::int)::int as template,
              'SC' || upper($1) || '-' || lpad(n::text, 5, '0') as label,
              now() - interval '365 days' * (1 - n::double precision / $2::int) - interval '1 hour' as imported_at,
              ($5::uuid[])[1 + n % cardinality($5::uuid[])] as importer,
              ($6::uuid[])[1 + n % cardinality($6::uuid[])] as chemist,
              case when cardinality($7::text[]) > 0 then ($7::text[])[1 + n % cardinality($7::text[])]
                   when n::double precision / $2::int > 0.94 then 'imported'
                   when n::double precision / $2::int > 0.90 then 'verified'
                   when n::double precision / $2::int > 0.86 then 'submitted'
                   else case when abs(hashtext($1 || n)) % 1000 < 20 then 'rejected'
                             when abs(hashtext($1 || n)) % 1000 < 30 then 'reopened'
                             when abs(hashtext($1 || n)) % 1000 < 80 then 'reworked'
                             else 'approved' end end as path
         from generate_series(1, $2::int) as n`,
    [
      options.tag,
      options.plates,
      options.screens,
      options.templates,
      who.biologists,
      who.chemists,
      options.paths ?? [],
    ],
  );
  await client.query('create index on fill_plates (n)');
  await client.query('create index on fill_plates (id)');
  // The steps of each path, with the meaning each signature states (lib/signoff/steps.ts).
  const steps = Object.entries(PATHS).flatMap(([path, list]) =>
    list.map((step, i) => ({
      path,
      step: i + 1,
      action: step.action,
      from_state: SIGNOFF_STEPS[step.action].from,
      to_state: SIGNOFF_STEPS[step.action].to,
      meaning: SIGNOFF_STEPS[step.action].meaning,
      decider: step.decider ?? null,
      steps_in_path: list.length,
    })),
  );
  await client.query(
    `create unlogged table fill_steps as select * from jsonb_to_recordset($1::jsonb) as x(path text, step int, action text,
       from_state text, to_state text, meaning text, decider int, steps_in_path int)`,
    [JSON.stringify(steps)],
  );
  await client.query(
    `create unlogged table fill_approvers as select idx - 1 as slot, id from unnest($1::uuid[]) with ordinality as a(id, idx)`,
    [who.approvers],
  );
}

/** Compounds of the registry, with their audit events; returns their ids in order. */
async function writeCompounds(client: pg.Client, options: FillOptions, chemistId: string): Promise<string[]> {
  await client.query('begin');
  const { rows } = await client.query<{ id: string }>(
    `with made as (
       insert into compounds (id, identifier, name, smiles, molecular_weight, created_by, created_at, updated_at)
       select overlay(overlay(md5($1 || ':compound:' || i) placing '4' from 13) placing '8' from 17)::uuid, 'SC' || upper($1) || '-' || lpad(i::text, 5, '0'), 'Scale compound ' || i, '',
              round((250 + (abs(hashtext($1 || 'mw' || i)) % 300) + 0.1 * (i % 10))::numeric, 1)::double precision, $3,
              now() - interval '400 days' + interval '1 minute' * i, now() - interval '400 days' + interval '1 minute' * i
         from generate_series(1, $2) as i
       returning id, identifier, name, smiles, molecular_weight, created_at)
     , audited as (
       insert into audit_events (occurred_at, actor_id, action, entity_type, entity_id, after, address)
       select created_at, $3, 'create', 'compound', id::text,
              jsonb_build_object('id', id, 'identifier', identifier, 'name', name, 'smiles', smiles, 'molecularWeight', molecular_weight),
              '127.0.0.1'
         from made)
     select id from made order by identifier`,
    [options.tag, options.compounds, chemistId],
  );
  await client.query(
    `create unlogged table fill_compounds as select (row_number() over (order by identifier) - 1)::int as idx, id from compounds
      where identifier like 'SC' || upper($1) || '-%'`,
    [options.tag],
  );
  await client.query('commit');
  return rows.map((r) => r.id);
}

/** Plates lo..hi with their files, wells, readouts, fits, fit jobs and import events, in one transaction. */
async function writePlates(client: pg.Client, options: FillOptions, lo: number, hi: number) {
  const range = [lo, hi, options.tag, options.compounds, COMPOUND_SLOTS];
  await client.query('begin');
  await client.query(
    `insert into uploaded_files (id, screen_id, filename, media_type, size_bytes, sha256, content, uploaded_by, uploaded_at)
     select p.file_id, s.id, p.label || '.xlsx', 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
            octet_length(c.bytes), encode(sha256(c.bytes), 'hex'), c.bytes, p.importer, p.imported_at
       from fill_plates p join fill_screens s on s.screen_idx = p.screen_idx
            cross join lateral (select convert_to('Gatewell scale fill, invented plate ' || p.label, 'UTF8') as bytes) c
      where p.n between $1 and $2`,
    range.slice(0, 2),
  );
  await client.query(
    `insert into plates (id, screen_id, uploaded_file_id, label, format, state, version, qc_summary, imported_by, imported_at, updated_at,
                         fits_pending, fits_requested_at, fitted_at, facts)
     select p.id, s.id, p.file_id, p.label, 384, 'imported', 1,
            replace(replace(ts.summary, '"t0"', '"' || t0.id || '"'), '"t1"', '"' || t1.id || '"')::jsonb,
            p.importer, p.imported_at, p.imported_at + interval '2 minutes', false, p.imported_at, p.imported_at + interval '2 minutes',
            jsonb_build_object('barcode', p.label, 'runDate', to_char(p.imported_at, 'YYYY-MM-DD'))
       from fill_plates p join fill_screens s on s.screen_idx = p.screen_idx
            join fill_template_summary ts on ts.template = p.template
            join fill_targets t0 on t0.screen_idx = p.screen_idx and t0.slot = 0
            join fill_targets t1 on t1.screen_idx = p.screen_idx and t1.slot = 1
      where p.n between $1 and $2`,
    range.slice(0, 2),
  );
  // Compound slot k of plate n holds compound (n·80 + k) mod C: every compound on as many plates.
  await client.query(
    `insert into wells (id, plate_id, position, row_index, column_index, role, compound_id, concentration_um,
                        seal_resistance_gohm, series_resistance_mohm, capacitance_pf)
     select overlay(overlay(md5($3 || ':well:' || p.n || ':' || w.position) placing '4' from 13) placing '8' from 17)::uuid, p.id, w.position, w.row_index, w.column_index, w.role, c.id,
            w.concentration_um, w.seal_resistance_gohm, w.series_resistance_mohm, w.capacitance_pf
       from fill_plates p join fill_template_wells w on w.template = p.template
            left join fill_compounds c on c.idx = (p.n * $5 + w.slot) % $4
      where p.n between $1 and $2`,
    range,
  );
  await client.query(
    `insert into readouts (well_id, target_id, control_current_pa, compound_current_pa, fractional_block, qc_reasons)
     select overlay(overlay(md5($3 || ':well:' || p.n || ':' || r.position) placing '4' from 13) placing '8' from 17)::uuid, t.id, r.control_current_pa, r.compound_current_pa,
            r.fractional_block, r.qc_reasons
       from fill_plates p join fill_template_readouts r on r.template = p.template
            join fill_targets t on t.screen_idx = p.screen_idx and t.slot = r.target_slot
      where p.n between $1 and $2`,
    range.slice(0, 3),
  );
  await client.query(
    `insert into fits (plate_id, compound_id, target_id, model, status, message, ic50_um, ic50_ci_low_um, ic50_ci_high_um,
                       ic50_lower_bound_um, log10_ic50_se, hill, top, bottom, r2, residual_sd, n, flags, estimate, computed_at)
     select p.id, c.id, t.id, f.model, f.status, f.message, f.ic50_um, f.ic50_ci_low_um, f.ic50_ci_high_um, f.ic50_lower_bound_um,
            f.log10_ic50_se, f.hill, f.top, f.bottom, f.r2, f.residual_sd, f.n, f.flags, f.estimate, p.imported_at + interval '2 minutes'
       from fill_plates p join fill_template_fits f on f.template = p.template
            join fill_compounds c on c.idx = (p.n * $4 + f.slot) % $3
            join fill_targets t on t.screen_idx = p.screen_idx and t.slot = f.target_slot
      where p.n between $1 and $2`,
    [lo, hi, options.compounds, COMPOUND_SLOTS],
  );
  await client.query(
    `insert into compute_jobs (id, kind, job_key, plate_id, requested_by, state, done, total, message, attempts, worker,
                               created_at, started_at, finished_at)
     select overlay(overlay(md5($3 || ':job:' || p.n) placing '4' from 13) placing '8' from 17)::uuid, 'plate-fits', 'plate-fits:' || p.id, p.id, p.importer, 'done', 0, null,
            (select count(*) from fill_template_fits f where f.template = p.template) || ' fit(s) computed.', 1, 'scale-fill',
            p.imported_at, p.imported_at + interval '1 minute', p.imported_at + interval '2 minutes'
       from fill_plates p where p.n between $1 and $2`,
    range.slice(0, 3),
  );
  await client.query(
    `insert into audit_events (occurred_at, actor_id, action, entity_type, entity_id, after, address)
     select p.imported_at, p.importer, 'import', 'plate', p.id::text,
            jsonb_build_object('label', p.label, 'screenId', s.id, 'format', 384, 'filename', p.label || '.xlsx',
              'sha256', f.sha256, 'wells', 384, 'readouts', 768, 'fitJobId', overlay(overlay(md5($3 || ':job:' || p.n) placing '4' from 13) placing '8' from 17)::uuid, 'supersedesPlateId', null),
            '127.0.0.1'
       from fill_plates p join fill_screens s on s.screen_idx = p.screen_idx join uploaded_files f on f.id = p.file_id
      where p.n between $1 and $2`,
    range.slice(0, 3),
  );
  await client.query('commit');
}

/** SHA-256 of each signed plate's content, as lib/signoff/plate-content.ts works it out, a few plates at a time. */
async function workOutHashes(client: pg.Client, options: FillOptions): Promise<number> {
  const { rows } = await client.query<{ id: string }>(
    `select id from fill_plates where path <> 'imported' order by n`,
  );
  const ids = rows.map((r) => r.id);
  const hashes: [string, string][] = [];
  let next = 0;
  let lastLog = performance.now();
  await Promise.all(
    Array.from({ length: options.hashConcurrency }, async () => {
      while (next < ids.length) {
        const id = ids[next++]!;
        hashes.push([id, await db().transaction((t) => plateContentSha256(id, t))]);
        if (performance.now() - lastLog > 15_000) {
          lastLog = performance.now();
          options.log(`  content hashes: ${hashes.length} of ${ids.length}`);
        }
      }
    }),
  );
  for (let i = 0; i < hashes.length; i += 5000) {
    const part = hashes.slice(i, i + 5000);
    await client.query('insert into fill_hashes select * from unnest($1::uuid[], $2::text[])', [
      part.map((h) => h[0]),
      part.map((h) => h[1]),
    ]);
  }
  return hashes.length;
}

/** Each step of sign-off over all plates that take it, in order: signatures, events, audit events; then final states. */
async function signOff(client: pg.Client, options: FillOptions): Promise<void> {
  const maxStep = Math.max(...Object.values(PATHS).map((p) => p.length));
  await client.query('begin');
  for (let step = 1; step <= maxStep; step++) {
    const parameters = [options.tag, step, REJECT_COMMENTS];
    // Who signs: the chemist verifies, the importer submits and reopens, an approver decides.
    await client.query(
      `create temp table fill_step on commit drop as
       select p.n, p.id as plate_id, s.action, s.from_state, s.to_state, s.meaning,
              case s.action when 'verify' then p.chemist when 'submit' then p.importer when 'rework' then p.importer
                   else (select a.id from fill_approvers a where a.slot = case when s.path = 'approved' then (p.n % 2) else s.decider end) end as signer,
              case s.action when 'reject' then ($3::text[])[1 + p.n % cardinality($3::text[])] else '' end as comment,
              least(p.imported_at + interval '3 hours' * s.step, now() - interval '1 minute' * (20 - s.step)) as at,
              overlay(overlay(md5($1 || ':signature:' || p.n || ':' || s.step) placing '4' from 13) placing '8' from 17)::uuid as signature_id,
              overlay(overlay(md5($1 || ':event:' || p.n || ':' || s.step) placing '4' from 13) placing '8' from 17)::uuid as event_id, h.sha, s.step
         from fill_plates p join fill_steps s on s.path = p.path and s.step = $2 join fill_hashes h on h.plate_id = p.id`,
      parameters,
    );
    await client.query(
      `insert into signatures (id, signer_id, meaning, comment, entity_type, entity_id, content_sha256, signed_at)
       select signature_id, signer, meaning, comment, 'plate', plate_id, sha, at from fill_step`,
    );
    await client.query(
      `insert into signoff_events (id, plate_id, signature_id, from_state, to_state, occurred_at)
       select event_id, plate_id, signature_id, from_state, to_state, at from fill_step order by n`,
    );
    await client.query(
      `insert into audit_events (occurred_at, actor_id, action, entity_type, entity_id, before, after, reason, address)
       select at, signer, 'sign', 'plate', plate_id::text, null,
              jsonb_build_object('signatureId', signature_id, 'meaning', meaning, 'comment', comment, 'contentSha256', sha),
              null, '127.0.0.1'
         from fill_step
       union all
       select at, signer, action, 'plate', plate_id::text,
              jsonb_build_object('state', from_state, 'version', step),
              jsonb_build_object('state', to_state, 'version', step + 1, 'signatureId', signature_id, 'signoffEventId', event_id,
                                 'meaning', meaning, 'contentSha256', sha),
              nullif(comment, ''), '127.0.0.1'
         from fill_step
        order by 1`,
    );
    await client.query('drop table fill_step');
  }
  // The final state and who signed in the last round (a rework clears the round's signers).
  await client.query(
    `update plates pl set state = last.to_state, version = 1 + last.steps_in_path, updated_at = last.at,
            verified_by = case when last.to_state in ('verified', 'submitted', 'approved', 'rejected') then p.chemist end,
            submitted_by = case when last.to_state in ('submitted', 'approved', 'rejected') then p.importer end,
            decided_by = case when last.to_state in ('approved', 'rejected') then last.signer end
       from fill_plates p
            join lateral (
              select s.to_state, s.steps_in_path, e.occurred_at as at, sg.signer_id as signer
                from fill_steps s join signoff_events e on e.plate_id = p.id and e.id = overlay(overlay(md5($1 || ':event:' || p.n || ':' || s.step) placing '4' from 13) placing '8' from 17)::uuid
                join signatures sg on sg.id = e.signature_id
               where s.path = p.path and s.step = s.steps_in_path) last on true
      where pl.id = p.id`,
    [options.tag],
  );
  await client.query('commit');
}

/** Forecasts through Gatewell's forecast service on approved plates spread over the year. */
async function writeForecasts(client: pg.Client, options: FillOptions, biologistId: string): Promise<number> {
  if (options.forecasts === 0) return 0;
  const actor = await loadActor(biologistId, '127.0.0.1');
  if (!actor) throw new Error('the biologist cannot sign in');
  const { rows } = await client.query<{ id: string }>(
    `select p.id from fill_plates f join plates p on p.id = f.id where p.state = 'approved' order by f.n`,
  );
  const step = Math.max(1, Math.floor(rows.length / options.forecasts));
  let stored = 0;
  for (let i = 0; i < rows.length && stored < options.forecasts; i += step) {
    const plateId = rows[i]!.id;
    const list = await listPlateForecasts(actor, plateId);
    const compound = list.compounds.find((c) => c.reason === null && !c.stored);
    if (!compound) continue;
    await getPlateForecast(actor, plateId, compound.compoundId, undefined, { here: true });
    stored++;
  }
  return stored;
}

/** Fills the database DATABASE_URL names (users seeded first) and says what it wrote and how long each part took. */
export async function fillScale(options: FillOptions): Promise<FillResult> {
  const seconds: Record<string, number> = {};
  // The work tables live in a schema of this fill's own (the app's role may create one), so that several
  // sessions can write plates side by side; it is dropped at the end.
  const schema = `scale_fill_${options.tag}`;
  const session = async () => {
    const client = new pg.Client({ connectionString: process.env.DATABASE_URL, options: '-c jit=off' });
    await client.connect();
    return client;
  };
  const client = await session();
  await client.query(`create schema ${schema}`);
  await client.query(`set search_path = ${schema}, public`);
  try {
    const who = await people(client);
    const templates = await timed(seconds, 'templates', async () =>
      Array.from({ length: options.templates }, (_, t) => makeTemplate(1000 + t)),
    );
    options.log(`${templates.length} templates analysed in ${seconds.templates!.toFixed(1)} s`);
    const screenIds = await timed(seconds, 'screens', () =>
      makeScreens(who.admin, options.screens, options.tag),
    );
    const compoundIds = await timed(seconds, 'compounds', () =>
      writeCompounds(client, options, who.chemists[0]!),
    );
    options.log(`${screenIds.length} screens, ${compoundIds.length} compounds`);
    await workTables(client, options, templates, screenIds, who);
    await timed(seconds, 'plates', async () => {
      const writers = await Promise.all(Array.from({ length: options.writers }, session));
      let next = 1;
      let written = 0;
      const start = performance.now();
      try {
        await Promise.all(
          writers.map(async (writer) => {
            await writer.query(`set search_path = ${schema}, public`);
            while (next <= options.plates) {
              const lo = next;
              const hi = Math.min(options.plates, lo + options.batch - 1);
              next = hi + 1;
              await writePlates(writer, options, lo, hi);
              written += hi - lo + 1;
              if (written % (options.batch * 4) === 0)
                options.log(
                  `  plates ${written} of ${options.plates} (${((performance.now() - start) / 1000).toFixed(0)} s)`,
                );
            }
          }),
        );
      } finally {
        await Promise.all(writers.map((writer) => writer.end()));
      }
    });
    options.log(`plates, wells, readouts, fits written in ${seconds.plates!.toFixed(1)} s`);
    const hashed = await timed(seconds, 'hashes', () => workOutHashes(client, options));
    options.log(`${hashed} content hashes in ${seconds.hashes!.toFixed(1)} s`);
    await timed(seconds, 'signoff', () => signOff(client, options));
    options.log(`sign-off written in ${seconds.signoff!.toFixed(1)} s`);
    const forecasts = await timed(seconds, 'forecasts', () =>
      writeForecasts(client, options, who.biologists[0]!),
    );
    options.log(`${forecasts} forecasts in ${seconds.forecasts!.toFixed(1)} s`);
    const { rows } = await client.query<{ id: string }>('select id from fill_plates order by n');
    return { plateIds: rows.map((r) => r.id), compoundIds, screenIds, approverIds: who.approvers, seconds };
  } finally {
    await client.query(`drop schema if exists ${schema} cascade`).catch(() => {});
    await client.end();
  }
}
