import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { json, route } from '@/app/_lib/server/route';
import { trialDto } from '@/app/_lib/rigs/trials';
import { MAX_SAMPLE_BODY_BYTES, ingestSamples, parseSampleBatch } from '@/app/_lib/sessions/samples';

/**
 * POST: a logger's batch of samples (JSON `{"samples":[…]}` or CSV `t,inletTempC,outletTempC,flowM3PerS[,ambientTempC]`),
 * usually with an API token. Idempotent by sample time: a retried batch stores nothing twice. Answers
 * what was stored, the live steady-state signal with the next flow to set, and the trials made from
 * steady periods that ended.
 */
export const POST = route<{ sessionId: string }>({ auth: 'user', maxBodyBytes: MAX_SAMPLE_BODY_BYTES }, async (ctx) => {
  const { row } = await loadInLab(ctx, 'session', ctx.params.sessionId, 'trial:write');
  const stream = ctx.bodyStream();
  const text = stream ? await new Response(stream).text() : '';
  const samples = parseSampleBatch(text, ctx.req.headers.get('content-type') ?? 'application/json');
  const r = await ingestSamples(ctx.em, row.id, samples, ctx.requireActor().user);
  return json({ stored: r.stored, duplicates: r.duplicates, sampleCount: r.sampleCount, live: r.live, trials: r.trials.map(trialDto) }, { status: r.stored ? 201 : 200 });
});
