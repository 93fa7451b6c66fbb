import { HttpError, badRequest } from '@/app/_lib/errors';
import { confirmImport, maxUploadBytes, previewImport, sourceFileDto, storeUpload } from '@/app/_lib/imports';
import { confirmedMappingSchema } from '@/app/_lib/import';
import { loadRig } from '@/app/_lib/rigs';
import { json, route } from '@/app/_lib/route';

/**
 * POST (multipart, for scripts): field `file`, optional `mapping` (JSON) and `sheet`. The file is
 * stored, mapped (the given mapping, the lab's saved one for these headers, or the suggestion)
 * and imported in one go; rows with errors refuse the whole import.
 */
export const POST = route<{ rigId: string }>({ auth: 'user', maxBodyBytes: maxUploadBytes() }, async (ctx) => {
  const { rig, member } = await loadRig(ctx, ctx.params.rigId, 'trial:write');
  let form: FormData;
  try {
    form = await ctx.req.formData();
  } catch {
    throw badRequest('Send multipart/form-data with the file in a field named "file".');
  }
  const part = form.get('file');
  if (!(part instanceof Blob)) throw badRequest('Send the file in a multipart field named "file".');
  const name = (part as File).name || 'upload';
  const { file, duplicate } = await storeUpload(ctx.em, rig, ctx.requireActor().user, part.stream(), name, part.type || 'application/octet-stream');
  if (duplicate && file.state === 'imported') {
    return json({ file: sourceFileDto(file), duplicate, message: `This file was imported before (${file.rowsImported} trials); nothing was added.` });
  }
  const sheet = typeof form.get('sheet') === 'string' ? String(form.get('sheet')) : undefined;
  let mapping: unknown;
  if (typeof form.get('mapping') === 'string') {
    try {
      mapping = JSON.parse(String(form.get('mapping')));
    } catch {
      throw badRequest('The "mapping" field is not valid JSON.');
    }
  } else {
    const p = await previewImport(ctx.em, member.lab, file, { sheet });
    if (p.mappingError) throw new HttpError(422, 'bad_mapping', `${p.mappingError} Send a "mapping" field.`, { suggestion: p.suggestion });
    mapping = p.mapping;
  }
  const result = await confirmImport(ctx.em, rig, file, { sheet, mapping: confirmedMappingSchema.parse(mapping), excludedLines: [] });
  return json({ file: sourceFileDto(file), duplicate, ...result }, { status: 201 });
});
