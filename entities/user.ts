import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { UNIT_SYSTEMS, type UnitSystem } from '../analysis/units/unit-system';

/**
 * A person who signs in. `passwordHash` is hidden: it never appears in serialised output.
 * `tokenVersion` is bumped to end every session at once (sign-out everywhere, password change).
 */
export const User = defineEntity({
  name: 'User',
  tableName: 'app_user',
  properties: {
    ...baseProperties(),
    email: p.string().length(254).unique(),
    name: p.string().length(120),
    passwordHash: p.string().length(255).hidden(),
    tokenVersion: p.integer().default(0),
    unitSystem: p.enum(() => [...UNIT_SYSTEMS]).default('si').$type<UnitSystem>(),
  },
});
