import 'server-only';
import { readFile } from 'node:fs/promises';
import type { EntityManager } from '@mikro-orm/postgresql';
import { SourceFile, type RigRow, type UserRow } from '@/entities';
import { badRequest, invalid } from '../server/errors';
import { putFile, type Spooled } from '../server/storage';

/** Photos of a rig: JPEG, PNG or WebP, at most this size. */
export const MAX_PHOTO_BYTES = 15 * 1024 * 1024;
const IMAGE_TYPES = new Set(['image/jpeg', 'image/png', 'image/webp']);

/** Magic numbers of the accepted formats: the declared type must match the bytes. */
export function sniff(head: Buffer): string | null {
  if (head[0] === 0xff && head[1] === 0xd8 && head[2] === 0xff) return 'image/jpeg';
  if (head.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))) return 'image/png';
  if (head.subarray(0, 4).toString('latin1') === 'RIFF' && head.subarray(8, 12).toString('latin1') === 'WEBP') return 'image/webp';
  return null;
}


/** Checks that a photo's declared type is an accepted picture type, before its body is read. */
export function checkPhotoType(type: string): void {
  if (!IMAGE_TYPES.has(type)) throw badRequest('Send a JPEG, PNG or WebP picture.');
}

/** A rig's photos, newest first. */
export const rigPhotos = (em: EntityManager, rig: RigRow) => em.find(SourceFile, { rig, purpose: 'photo' }, { orderBy: { createdAt: 'desc' } });

/**
 * Stores a spooled photo of the rig when its bytes are the declared picture type (magic numbers);
 * the same picture twice is kept once.
 */
export async function savePhoto(em: EntityManager, rig: RigRow, user: UserRow, spooled: Spooled, filename: string, type: string) {
  const head = (await readFile(spooled.file)).subarray(0, 16);
  if (sniff(head) !== type) throw invalid(`"${filename}" is not a ${type.split('/')[1].toUpperCase()} picture.`, undefined, 'not_image');
  const existing = await em.findOne(SourceFile, { lab: rig.lab, sha256: spooled.sha256, purpose: 'photo' });
  if (existing) return { photo: existing, duplicate: true };
  const storageKey = await putFile(spooled, rig.lab.id, type);
  const photo = em.create(SourceFile, { lab: rig.lab, rig, uploadedBy: user, purpose: 'photo', filename: filename.slice(0, 255), contentType: type, sizeBytes: spooled.sizeBytes, sha256: spooled.sha256, storageKey });
  await em.flush();
  return { photo, duplicate: false };
}
