/**
 * The owner invites a reviewer; the invitation mail is read from the SMTP fake; the reviewer
 * accepts, signs in and sees only what a reviewer may do. Screenshots go to test-results/.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { openBrowser, screenshot, visit } from './support/browser';
import { STRONG_PASSWORD, uniqueEmail, waitForMailLink } from '../app/support/client';

describe('invitation walk-through in Chromium', () => {
  let owner: Awaited<ReturnType<typeof openBrowser>>;
  let reviewer: Awaited<ReturnType<typeof openBrowser>>;
  const invitee = uniqueEmail('new-reviewer');

  beforeAll(async () => {
    owner = await openBrowser();
    reviewer = await openBrowser({ viewport: { width: 390, height: 844 } });
  });
  afterAll(async () => {
    await owner?.close();
    await reviewer?.close();
  });

  test('the owner signs in and sends an invitation', async () => {
    const p = owner.page;
    await visit(p, '/sign-in');
    await screenshot(p, 'sign-in');
    await p.getByLabel('E-mail').fill('owner@cinder-hollow.test');
    await p.getByLabel('Password').fill('ember-demo-lab-2026');
    await p.getByRole('button', { name: 'Sign in' }).click();
    await p.waitForURL('**/start');
    await p.getByRole('region', { name: 'Your team' }).waitFor();
    await screenshot(p, 'owner-start');
    await visit(p, '/lab/members');
    await p.getByLabel('E-mail').fill(invitee);
    await p.getByLabel('Role', { exact: true }).selectOption('reviewer');
    await p.getByRole('button', { name: 'Send invitation' }).click();
    await p.getByText('Invitation sent.').waitFor();
    await p.getByText(invitee).first().waitFor(); // listed under pending invitations after the refresh
    await screenshot(p, 'owner-members-invited');
  });

  test('the invitee reads the mail, creates an account, accepts and sees a reviewer’s view', async () => {
    const { link, mail } = await waitForMailLink(invitee, /You are invited to Cinder Hollow Test Yard/);
    expect(mail.text).toMatch(/as a reviewer/);
    const p = reviewer.page;
    await visit(p, link);
    await expect(p.getByRole('heading', { level: 1 }).innerText()).resolves.toBe('Join Cinder Hollow Test Yard');
    await screenshot(p, 'invitation-page');
    await p.getByRole('link', { name: 'Create an account' }).click();
    await p.getByLabel('Your name').fill('New Reviewer');
    await p.getByLabel('E-mail').fill(invitee);
    await p.getByLabel('Password', { exact: true }).fill(STRONG_PASSWORD);
    await p.getByRole('button', { name: 'Create account' }).click();
    await p.getByText(`We sent a message to ${invitee}`).waitFor();
    const confirm = await waitForMailLink(invitee, /Finish signing up/);
    await visit(p, confirm.link);
    await p.getByRole('button', { name: 'Create my account' }).click();
    await p.waitForURL('**/invitations/**');
    await p.getByRole('button', { name: 'Accept and join' }).click();
    await p.waitForURL('**/rigs');
    await expect(p.getByLabel('Current lab').inputValue()).resolves.not.toBe('');
    await expect(p.locator('nav[aria-label="Lab"]').innerText()).resolves.toMatch(/Cinder Hollow Test Yard\s*reviewer/);
    await screenshot(p, 'reviewer-rigs-phone');

    // sign out and back in, as a person would the next day (on a phone, from the header's Menu)
    await p.getByRole('button', { name: 'Menu' }).click();
    await p.getByRole('button', { name: 'Sign out' }).click();
    await p.waitForURL('**/sign-in');
    await p.getByLabel('E-mail').fill(invitee);
    await p.getByLabel('Password').fill(STRONG_PASSWORD);
    await p.getByRole('button', { name: 'Sign in' }).click();
    await p.waitForURL('**/start');
    await screenshot(p, 'reviewer-signed-in-again');

    // a reviewer reads members but cannot invite; the audit log does not exist for them; no API tokens
    await visit(p, '/lab/members');
    await screenshot(p, 'reviewer-members-phone');
    expect(await p.getByRole('button', { name: 'Send invitation' }).count()).toBe(0);
    expect(await p.getByRole('combobox', { name: /Role of/ }).count()).toBe(0);
    await expect(p.getByRole('heading', { name: 'Your role: reviewer' }).count()).resolves.toBe(1);
    // A refused page answers 404 with the not-found page (every page and caller: test/app/authorization/pages.test.ts).
    reviewer.expectConsoleError(/status of 404/); // the refused page's own answer
    const refused = await visit(p, '/lab/audit');
    expect(refused?.status()).toBe(404);
    await expect(p.getByRole('heading', { level: 1 }).innerText()).resolves.toBe('Nothing here');
    expect(await p.getByText('invitation-sent').count()).toBe(0);
    await visit(p, '/account');
    // Tokens are offered only for the lab the reviewer owns (made at sign-up), never for this one.
    const tokenLabs = await p.getByRole('combobox', { name: 'Lab', exact: true }).locator('option').allInnerTexts();
    expect(tokenLabs).toEqual(["New Reviewer's lab"]);
    await screenshot(p, 'reviewer-account-phone');
  });

  test('the owner sees the acceptance in the audit log and the mail in the demo mailbox', async () => {
    const p = owner.page;
    await visit(p, '/lab/audit');
    const rows = await p.locator('tbody').innerText();
    expect(rows).toMatch(/invitation-accepted/);
    expect(rows).toMatch(/invitation-sent/);
    await screenshot(p, 'owner-audit');
    await visit(p, '/lab/mail');
    await expect(p.getByText(invitee).count()).resolves.toBeGreaterThan(0);
    await screenshot(p, 'owner-mail');
    await visit(p, '/help/permissions');
    await screenshot(p, 'permissions-help');
  });

  test('the owner changes the new member’s role in the members table', async () => {
    const p = owner.page;
    await visit(p, '/lab/members');
    const select = p.getByRole('combobox', { name: 'Role of New Reviewer' });
    await select.selectOption('engineer');
    await p.waitForResponse((r) => r.url().includes('/members/') && r.request().method() === 'PATCH');
    await visit(p, '/lab/members');
    await expect(p.getByRole('combobox', { name: 'Role of New Reviewer' }).inputValue()).resolves.toBe('engineer');
    await screenshot(p, 'owner-role-changed');
    // the last owner cannot be demoted: the table says why
    owner.expectConsoleError(/status of 409/); // the refusal, shown in the table
    await p.getByRole('combobox', { name: 'Role of Demo Owner' }).selectOption('viewer');
    await p.getByRole('alert').filter({ hasText: 'at least one owner' }).waitFor();
    await screenshot(p, 'owner-last-owner-refused');
  });
});
