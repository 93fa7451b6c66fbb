import { randomUUID } from 'node:crypto';
import { p } from '@mikro-orm/core';

/**
 * The base of every table: a uuid primary key and creation/update times (timestamptz). Each
 * entity spreads `baseProperties()` into its own properties (rather than `extends`, whose
 * columns the inferred row types would not show). Entities use `defineEntity` with an explicit
 * `name` and `tableName`, because production bundling renames classes (see ../shared/STACK.md).
 */
export const baseProperties = () => ({
  id: p.uuid().primary().onCreate(() => randomUUID()),
  createdAt: p.datetime().columnType('timestamptz').onCreate(() => new Date()),
  updatedAt: p
    .datetime()
    .columnType('timestamptz')
    .onCreate(() => new Date())
    .onUpdate(() => new Date()),
});

/** A double-precision column read back as a JS number (MikroORM's default for double is string). */
export const num = () => p.double().runtimeType('number').$type<number>();
