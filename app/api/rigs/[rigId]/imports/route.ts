import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { DomainError, badRequest } from '@/app/_lib/server/errors';
import { confirmImport, maxUploadBytes, previewImport, sourceFileDto, storeSpooled } from '@/app/_lib/imports/trial-sheets';
import { confirmedMappingSchema } from '@/app/_lib/imports';
import { json, route } from '@/app/_lib/server/route';

/**
 * POST (multipart, for scripts): field `file`, optional `mapping` (JSON) and `sheet`. The file is
 * stored, mapped (the given mapping, the lab's saved one for these headers, or the suggestion)
 * and imported in one go; rows with errors refuse the whole import.
 */
export const POST = route<{ rigId: string }>({ auth: 'user', maxBodyBytes: maxUploadBytes() }, async (ctx) => {
  const { row: rig, member } = await loadInLab(ctx, 'rig', ctx.params.rigId, 'trial:write');
  // streamed: the file part goes to a temporary file as it arrives (removed after the handler)
  const form = await ctx.formData({ fileFields: ['file'] });
  const part = form.files[0];
  if (!part) throw badRequest('Send the file in a multipart field named "file".');
  const { file, duplicate } = await storeSpooled(ctx.em, rig, ctx.requireActor().user, part, part.filename, part.contentType);
  if (duplicate && file.state === 'imported') {
    return json({ file: sourceFileDto(file), duplicate, message: `This file was imported before (${file.rowsImported} trials); nothing was added.` });
  }
  const sheet = form.fields.get('sheet');
  let mapping: unknown;
  const mappingText = form.fields.get('mapping');
  if (mappingText !== undefined) {
    try {
      mapping = JSON.parse(mappingText);
    } catch {
      throw badRequest('The "mapping" field is not valid JSON.');
    }
  } else {
    const p = await previewImport(ctx.em, member.lab, file, { sheet });
    if (p.mappingError) throw new DomainError('invalid', 'bad_mapping', `${p.mappingError} Send a "mapping" field.`, { suggestion: p.suggestion });
    mapping = p.mapping;
  }
  const result = await confirmImport(ctx.em, rig, file, { sheet, mapping: confirmedMappingSchema.parse(mapping), excludedLines: [] });
  return json({ file: sourceFileDto(file), duplicate, ...result }, { status: 201 });
});
