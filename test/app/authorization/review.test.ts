/**
 * Review transitions of fits and studies (`review()` in app/_lib/fits/fits.ts: draft → in review →
 * approved / changes requested), made by authors and others of lab A (the demo lab's roles,
 * test/app/support/authz.ts) on objects made here. Who may make a move is the permissions table
 * (submit: fit:write; approve and request-changes: review:decide); on top of it nobody approves or
 * returns their own work: the author of a fit, and for a study its author and anyone who edited it
 * since the last review decision (403). Owners still approve other people's work.
 */
import { beforeAll, describe, expect, test } from 'vitest';
import type { Client } from '../support/client';
import { labA, rigWithTrials, setAddressRange, type Role } from '../support/authz';

setAddressRange('203.0.113.');

type Kind = 'fits' | 'studies';
let labId: string;
let c: Record<Role, Client>;
let rigId: string;
let trialIds: string[];
const run = `${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;
let seq = 0;

beforeAll(async () => {
  ({ labId, clients: c } = await labA());
  ({ rig: { id: rigId }, trialIds } = await rigWithTrials(c.engineer, labId, `Review rig ${run}`));
}, 60_000);

async function newFit(by: Client): Promise<string> {
  const r = await by.post(`/api/labs/${labId}/fits`, { rigId, title: `Review fit ${run} ${seq++}`, model: 'coil', trialIds });
  expect(r.status, r.text).toBe(201);
  return r.body.fit.id;
}

async function newStudy(by: Client): Promise<string> {
  const r = await by.post(`/api/labs/${labId}/studies`, { title: `Review study ${run} ${seq++}` });
  expect(r.status, r.text).toBe(201);
  return r.body.study.id;
}

/** An edit of the study's text block by `by`. */
async function edit(by: Client, id: string, words: string) {
  const s = (await by.get(`/api/studies/${id}`)).body.study;
  const blocks = s.blocks.map((b: { kind: string; data: object }) => (b.kind === 'text' ? { ...b, data: { markdown: words } } : b));
  const r = await by.request('PUT', `/api/studies/${id}`, { title: s.title, baseRevision: s.revision, blocks });
  expect(r.status, r.text).toBe(200);
}

/** Makes the move as `who` and checks the status (and, on 200, the new state). */
async function move(kind: Kind, id: string, who: Role, m: 'submit' | 'approve' | 'request-changes', status: number, to?: string) {
  const r = await c[who].post(`/api/${kind}/${id}/review`, { move: m, note: `${m} by ${who}` });
  expect(r.status, `${m} by ${who}: ${r.text.slice(0, 200)}`).toBe(status);
  if (status === 200) expect(r.body.reviewState).toBe(to);
}

async function stateOf(kind: Kind, id: string): Promise<string> {
  const r = await c.viewer.get(`/api/${kind}/${id}`);
  return (kind === 'fits' ? r.body.fit : r.body.study).reviewState;
}

describe('review moves and who makes them', () => {
  test("an engineer's fit: the author submits but cannot decide; a reviewer returns it; the owner approves the resubmission", async () => {
    const id = await newFit(c.engineer);
    await move('fits', id, 'viewer', 'submit', 403);
    await move('fits', id, 'reviewer', 'submit', 403); // submitting is an author's move (fit:write)
    await move('fits', id, 'owner', 'approve', 409); // a draft cannot be approved
    await move('fits', id, 'engineer', 'submit', 200, 'in-review');
    await move('fits', id, 'engineer', 'submit', 409);
    await move('fits', id, 'engineer', 'approve', 403);
    await move('fits', id, 'engineer', 'request-changes', 403);
    await move('fits', id, 'viewer', 'approve', 403);
    expect(await stateOf('fits', id)).toBe('in-review');
    await move('fits', id, 'reviewer', 'request-changes', 200, 'changes-requested');
    await move('fits', id, 'owner', 'approve', 409);
    await move('fits', id, 'engineer', 'submit', 200, 'in-review');
    await move('fits', id, 'owner', 'approve', 200, 'approved');
    await move('fits', id, 'reviewer', 'approve', 409);
    expect(await stateOf('fits', id)).toBe('approved');
  });

  test("an engineer's study, untouched by others: the author cannot decide; the owner approves it", async () => {
    const id = await newStudy(c.engineer);
    await move('studies', id, 'viewer', 'submit', 403);
    await move('studies', id, 'engineer', 'submit', 200, 'in-review');
    await move('studies', id, 'engineer', 'approve', 403);
    await move('studies', id, 'viewer', 'request-changes', 403);
    await move('studies', id, 'owner', 'approve', 200, 'approved');
  });
});

describe('nobody approves or returns their own work', () => {
  test.each(['fits', 'studies'] as const)("the owner's own %s: the owner neither approves nor returns it (403); a reviewer approves it", async (kind) => {
    const id = kind === 'fits' ? await newFit(c.owner) : await newStudy(c.owner);
    await move(kind, id, 'owner', 'submit', 200, 'in-review');
    await move(kind, id, 'owner', 'approve', 403);
    await move(kind, id, 'owner', 'request-changes', 403);
    expect(await stateOf(kind, id)).toBe('in-review');
    await move(kind, id, 'reviewer', 'approve', 200, 'approved');
  });

  test('an owner who edited an engineer’s study may not decide on it until a review decision has passed', async () => {
    const id = await newStudy(c.engineer);
    await edit(c.owner, id, '## Owner’s edit\n\nThe inlet was 18 °C throughout.');
    await move('studies', id, 'engineer', 'submit', 200, 'in-review');
    await move('studies', id, 'owner', 'approve', 403);
    await move('studies', id, 'owner', 'request-changes', 403);
    expect(await stateOf('studies', id)).toBe('in-review');
    // a reviewer returns it and only its author edits it since: the owner's edit is before the last review
    await move('studies', id, 'reviewer', 'request-changes', 200, 'changes-requested');
    await edit(c.engineer, id, '## Engineer’s answer\n\nThe table assumes an inlet of 18 °C.');
    await move('studies', id, 'engineer', 'submit', 200, 'in-review');
    await move('studies', id, 'owner', 'approve', 200, 'approved');
  });
});
