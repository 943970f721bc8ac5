import 'server-only';
import { Op, type Transaction } from 'sequelize';
import { recordAudit } from '@/lib/audit/record';
import { requireCapability, type Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { headerFingerprint } from '@/lib/imports/fingerprint';
import { layoutHeaderCells } from '@/lib/imports/reshape-table';
import {
  columnMappingDraftSchema,
  importTemplateSchema,
  type ColumnMapping,
  type ColumnMappingInput,
} from '@/lib/imports/mapping-schema';
import { normaliseLabel } from '@/lib/imports/normalise-text';
import type { SheetData } from '@/lib/imports/spreadsheet-types';
import { ImportTemplate, Target, TargetAlias } from '@/models';

export interface TemplateSummary {
  id: string;
  name: string;
  /** The stored mapping, upgraded to the current version (a version 1 template still applies). */
  mapping: ColumnMapping;
  /** Normalised header texts of the layout's well sheet; null for a template saved before fingerprints. */
  fingerprint: string | null;
}

const summary = (t: ImportTemplate): TemplateSummary => ({
  id: t.id,
  name: t.name,
  mapping: columnMappingDraftSchema.parse(t.mapping),
  fingerprint: t.fingerprint ?? null,
});

/** Saved column mappings by name; any signed-in person may see which layouts exist. */
export async function listTemplates(actor: Actor): Promise<TemplateSummary[]> {
  void actor;
  db();
  const templates = await ImportTemplate.findAll({ order: [['name', 'ASC']] });
  return templates.map(summary);
}

/** A template to save: its name, its mapping and the header row of the file's well sheet it was made on. */
export interface TemplateInput {
  name: string;
  mapping: ColumnMappingInput;
  /** The cells of the well sheet's header row, for the fingerprint (null keeps the stored one). */
  headerCells: readonly (string | number | boolean | null)[] | null;
}

/**
 * Saves a template under its name (case-blind): creates it, or replaces the mapping and fingerprint of the
 * one of that name; audited. In the caller's transaction when given (an import saves its template with
 * the plate).
 */
export async function saveTemplate(
  actor: Actor,
  input: TemplateInput,
  transaction?: Transaction,
): Promise<TemplateSummary> {
  requireCapability(actor, 'importPlates');
  const { name, mapping } = importTemplateSchema.parse({ name: input.name, mapping: input.mapping });
  const fingerprint = input.headerCells ? headerFingerprint(input.headerCells) : undefined;
  const work = async (t: Transaction) => {
    const existing = await ImportTemplate.findOne({
      where: db().where(db().fn('lower', db().col('name')), name.toLowerCase()),
      transaction: t,
      lock: t.LOCK.UPDATE,
    });
    if (!existing) {
      const created = await ImportTemplate.create(
        { name, mapping, fingerprint: fingerprint ?? null, createdBy: actor.id },
        { transaction: t },
      );
      await recordAudit(
        {
          actorId: actor.id,
          action: 'create',
          entityType: 'import_template',
          entityId: created.id,
          after: { name, mapping, fingerprint: created.fingerprint },
          address: actor.address,
        },
        t,
      );
      return summary(created);
    }
    const nextFingerprint = fingerprint === undefined ? existing.fingerprint : fingerprint;
    if (
      JSON.stringify(existing.mapping) !== JSON.stringify(mapping) ||
      existing.fingerprint !== nextFingerprint
    ) {
      const before = { mapping: existing.mapping, fingerprint: existing.fingerprint };
      await existing.update({ mapping, fingerprint: nextFingerprint ?? null }, { transaction: t });
      await recordAudit(
        {
          actorId: actor.id,
          action: 'update',
          entityType: 'import_template',
          entityId: existing.id,
          before,
          after: { mapping, fingerprint: nextFingerprint },
          address: actor.address,
        },
        t,
      );
    }
    return summary(existing);
  };
  return transaction ? work(transaction) : db().transaction(work);
}

/** Deletes a template (plates made with it keep their data and lose the link); audited. */
export async function deleteTemplate(actor: Actor, id: string): Promise<void> {
  requireCapability(actor, 'importPlates');
  await db().transaction(async (transaction) => {
    const template = await ImportTemplate.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
    if (!template) throw new AppError('not_found', 'No such template.');
    await template.destroy({ transaction });
    await recordAudit(
      {
        actorId: actor.id,
        action: 'delete',
        entityType: 'import_template',
        entityId: id,
        before: { name: template.name, mapping: template.mapping, fingerprint: template.fingerprint },
        address: actor.address,
      },
      transaction,
    );
  });
}

/** A template recognised in a file: the sheet whose header row matches its fingerprint. */
export interface RecognisedTemplate {
  template: TemplateSummary;
  sheet: string;
}

/**
 * The template whose fingerprint matches the header row (at the template's header row) of one of the
 * file's sheets; the sheet the template names is tried first. Null when none matches.
 */
export async function recogniseTemplate(sheets: readonly SheetData[]): Promise<RecognisedTemplate | null> {
  db();
  const templates = (
    await ImportTemplate.findAll({
      where: { fingerprint: { [Op.ne]: null } },
      order: [['updatedAt', 'DESC']],
    })
  ).map(summary);
  return matchTemplate(templates, sheets);
}

/** The first template whose fingerprint one of the sheets shows at the template's header row. */
export function matchTemplate(
  templates: readonly TemplateSummary[],
  sheets: readonly SheetData[],
): RecognisedTemplate | null {
  for (const template of templates) {
    if (!template.fingerprint) continue;
    const named = template.mapping.wellSheet;
    const ordered = [...sheets].sort((a, b) => Number(b.name === named) - Number(a.name === named));
    for (const sheet of ordered) {
      const { layout, headerRow } = template.mapping;
      if (headerFingerprint(layoutHeaderCells(sheet, layout, headerRow)) === template.fingerprint)
        return { template, sheet: sheet.name };
    }
  }
  return null;
}

/** The screen's remembered target aliases: alias as the file wrote it → the target's name. */
export async function screenTargetAliases(
  screenId: string,
  transaction?: Transaction,
): Promise<Record<string, string>> {
  db();
  const [aliases, targets] = await Promise.all([
    TargetAlias.findAll({
      where: { screenId },
      order: [['createdAt', 'ASC']],
      ...(transaction ? { transaction } : {}),
    }),
    Target.findAll({ where: { screenId }, ...(transaction ? { transaction } : {}) }),
  ]);
  const names = new Map(targets.map((t) => [t.id, t.name]));
  return Object.fromEntries(
    aliases.flatMap((a) => (names.has(a.targetId) ? [[a.alias, names.get(a.targetId)!] as const] : [])),
  );
}

/**
 * Remembers the mapping's target values as aliases of the screen's targets (new ones only; a value that is
 * already a target's name needs none); audited. Returns the aliases added.
 */
export async function rememberTargetAliases(
  actor: Actor,
  screenId: string,
  targetValues: Readonly<Record<string, string>>,
  transaction: Transaction,
): Promise<string[]> {
  const targets = await Target.findAll({ where: { screenId }, transaction });
  const byName = new Map(targets.map((t) => [normaliseLabel(t.name), t]));
  const existing = new Set(
    (await TargetAlias.findAll({ where: { screenId }, transaction })).map((a) => a.aliasKey),
  );
  const added: string[] = [];
  for (const [value, name] of Object.entries(targetValues)) {
    const alias = value.trim();
    const aliasKey = normaliseLabel(alias);
    const target = byName.get(normaliseLabel(name));
    if (!target || aliasKey === '' || byName.has(aliasKey) || existing.has(aliasKey)) continue;
    const created = await TargetAlias.create(
      { screenId, targetId: target.id, alias, aliasKey, createdBy: actor.id },
      { transaction },
    );
    existing.add(aliasKey);
    added.push(alias);
    await recordAudit(
      {
        actorId: actor.id,
        action: 'create',
        entityType: 'target_alias',
        entityId: created.id,
        after: { screenId, target: target.name, alias },
        address: actor.address,
      },
      transaction,
    );
  }
  return added;
}
