/** Sign-up and password reset as a person does them, in Chromium, with the mail read from the SMTP fake. */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { openBrowser, screenshot, visit } from './support/browser';
import { STRONG_PASSWORD, baseUrl, uniqueEmail, waitForMailLink } from '../app/support/client';

describe('sign-up and password reset in Chromium', () => {
  let b: Awaited<ReturnType<typeof openBrowser>>;
  const email = uniqueEmail('walk');
  beforeAll(async () => {
    b = await openBrowser();
  });
  afterAll(async () => b?.close());

  test('a new user is told why a weak password is refused, then signs up with a passphrase and the mailed link', async () => {
    const p = b.page;
    await visit(p, '/sign-up');
    await p.getByLabel('Your name').fill('Walk Through');
    await p.getByLabel('E-mail').fill(email);
    await p.getByLabel('Password', { exact: true }).fill('password1234');
    await p.getByLabel('Lab name (optional)').fill('Riverside Shed');
    b.expectConsoleError(/status of 422/); // the refusal of the weak password
    await p.getByRole('button', { name: 'Create account' }).click();
    await p.getByText('commonly used passwords').first().waitFor();
    await screenshot(p, 'sign-up-weak-password');
    await p.getByLabel('Password', { exact: true }).fill(STRONG_PASSWORD);
    await p.getByRole('button', { name: 'Create account' }).click();
    // the same answer whether or not the address has an account: the mail decides
    await p.getByText(`We sent a message to ${email}`).waitFor();
    await screenshot(p, 'sign-up-check-inbox');
    const { link } = await waitForMailLink(email, /Finish signing up/);
    await visit(p, link);
    await screenshot(p, 'sign-up-confirm');
    await p.getByRole('button', { name: 'Create my account' }).click();
    await p.waitForURL('**/rigs');
    await expect(p.locator('nav[aria-label="Lab"]').innerText()).resolves.toMatch(/Riverside Shed\s*owner/);
    await screenshot(p, 'sign-up-new-lab');
  });

  test('after signing in, a ?next= that points at another host is not followed', async () => {
    const p = b.page;
    await p.getByRole('button', { name: 'Sign out' }).click();
    await p.waitForURL('**/sign-in');
    await visit(p, `/sign-in?next=${encodeURIComponent('/\\example.com/')}`);
    await p.getByLabel('E-mail').fill(email);
    await p.getByLabel('Password').fill(STRONG_PASSWORD);
    await p.getByRole('button', { name: 'Sign in' }).click();
    await p.waitForURL('**/start');
    expect(new URL(p.url()).origin).toBe(new URL(baseUrl).origin);
  });

  test('a forgotten password is reset through the mailed link, which then no longer works', async () => {
    const p = b.page;
    await p.getByRole('button', { name: 'Sign out' }).click();
    await p.waitForURL('**/sign-in');
    await visit(p, '/forgot-password');
    await p.getByLabel('E-mail').fill(email);
    await p.getByRole('button', { name: 'Send the link' }).click();
    await p.getByText('reset link is on its way').waitFor();
    await screenshot(p, 'forgot-password-sent');
    const { link } = await waitForMailLink(email, /Reset your Emberline password/);
    await visit(p, link);
    await p.getByLabel('New password').fill('a fresh phrase for the yard');
    await screenshot(p, 'reset-password-form');
    await p.getByRole('button', { name: 'Save and sign in' }).click();
    await p.waitForURL('**/rigs');
    await visit(p, link);
    await p.getByRole('alert').filter({ hasText: 'already been used' }).waitFor();
    await screenshot(p, 'reset-link-used');
  });
});
