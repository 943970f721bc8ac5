import 'server-only';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { ImportTemplate } from '@/models';

export interface TemplateSummary {
  id: string;
  name: string;
  mapping: Record<string, unknown>;
}

/** Saved column mappings by name; any signed-in person may see which layouts exist. */
export async function listTemplates(actor: Actor): Promise<TemplateSummary[]> {
  void actor;
  db();
  const templates = await ImportTemplate.findAll({ order: [['name', 'ASC']] });
  return templates.map((t) => ({ id: t.id, name: t.name, mapping: t.mapping }));
}
