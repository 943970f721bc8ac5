import 'server-only';
import type { Transaction } from 'sequelize';
import { recordAudit } from '@/lib/audit/record';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { parseOrRefuse } from '@/lib/validation/parse';
import { signatureSchema, type SignatureInput } from '@/lib/validation/signature';
import { Signature } from '@/models';
import { contentSha256 } from './canonical-json';
import { reverifyPassword } from './reverify';
import type { Actor } from './roles';

export interface SignatureRecord {
  id: string;
  signerId: string;
  signerName: string;
  meaning: string;
  comment: string;
  entityType: string;
  entityId: string;
  contentSha256: string;
  signedAt: string;
}

function hashOf(content: unknown): string {
  try {
    return contentSha256(content);
  } catch (error) {
    throw new AppError(
      'invalid',
      error instanceof Error ? error.message : 'The signed content is not valid JSON.',
    );
  }
}

/**
 * Signs a record electronically: re-verifies the signer's password (a wrong one is refused and counts
 * as a failed attempt for throttling), hashes the canonical JSON of the content with SHA-256, and writes
 * the signature and its audit event in the caller's transaction. Which roles may sign what is the
 * caller's rule; this primitive only proves who signed which content, meaning what, and when.
 */
export async function signRecord(
  actor: Actor,
  raw: SignatureInput,
  transaction: Transaction,
): Promise<SignatureRecord> {
  db();
  const input = parseOrRefuse(signatureSchema, raw, 'The signature is not complete.');
  const sha256 = hashOf(input.content);
  await reverifyPassword(actor, input.password, {
    failedAction: 'sign_failed',
    entityType: input.entityType,
    entityId: input.entityId,
    field: 'password',
  });

  const signature = await Signature.create(
    {
      signerId: actor.id,
      meaning: input.meaning,
      comment: input.comment,
      entityType: input.entityType,
      entityId: input.entityId,
      contentSha256: sha256,
    },
    { transaction },
  );
  const record: SignatureRecord = {
    id: signature.id,
    signerId: actor.id,
    signerName: actor.name,
    meaning: signature.meaning,
    comment: signature.comment,
    entityType: signature.entityType,
    entityId: signature.entityId,
    contentSha256: signature.contentSha256,
    signedAt: new Date(signature.signedAt).toISOString(),
  };
  await recordAudit(
    {
      actorId: actor.id,
      action: 'sign',
      entityType: input.entityType,
      entityId: input.entityId,
      after: {
        signatureId: record.id,
        meaning: record.meaning,
        comment: record.comment,
        contentSha256: record.contentSha256,
      },
      address: actor.address,
    },
    transaction,
  );
  return record;
}
