/**
 * The one permissions table. Every route handler consults it through `route()` in
 * app/_lib/server/route.ts; the help page renders it. Owners may do everything.
 */
import type { Role } from '@/entities/membership';
export { ROLES, type Role } from '@/entities/membership';

export const ACTIONS = {
  'lab:read': { label: 'Read rigs, trials, fits, forecasts and studies', roles: ['owner', 'engineer', 'reviewer', 'viewer'] },
  'lab:export': { label: 'Export tables, spreadsheets and plots', roles: ['owner', 'engineer', 'reviewer', 'viewer'] },
  'rig:write': { label: 'Create and edit rigs', roles: ['owner', 'engineer'] },
  'trial:write': { label: 'Import, enter, edit and exclude trials', roles: ['owner', 'engineer'] },
  'fit:write': { label: 'Fit models and save fits', roles: ['owner', 'engineer'] },
  'study:write': { label: 'Write studies, forecasts and design comparisons', roles: ['owner', 'engineer'] },
  'review:comment': { label: 'Comment on fits, studies and design comparisons', roles: ['owner', 'engineer', 'reviewer'] },
  'review:decide': { label: 'Approve or request changes', roles: ['owner', 'reviewer'] },
  'share:manage': { label: 'Create and revoke share links', roles: ['owner', 'engineer'] },
  'token:manage': { label: 'Create personal API tokens for scripts and loggers', roles: ['owner', 'engineer'] },
  'member:manage': { label: 'Invite members, change roles, remove members', roles: ['owner'] },
  'audit:read': { label: 'Read the security audit log', roles: ['owner'] },
  'mail:read': { label: 'Read captured e-mail (demo mode)', roles: ['owner'] },
} as const satisfies Record<string, { label: string; roles: readonly Role[] }>;

export type Action = keyof typeof ACTIONS;

export function can(role: Role | null | undefined, action: Action): boolean {
  return !!role && (ACTIONS[action].roles as readonly Role[]).includes(role);
}

export const ROLE_SUMMARIES: Record<Role, string> = {
  owner: 'Runs the lab: everything an engineer and a reviewer can do, plus members, roles and the audit log.',
  engineer: 'Imports trials, fits models, writes studies and asks for review.',
  reviewer: 'Checks fits and residuals, comments, and approves or returns work.',
  viewer: 'Reads studies and results and exports them; changes nothing.',
};
