import { Migration } from '@mikro-orm/migrations';

/**
 * Study block data computed once and kept (a saved fit's blocks, a forecast block's result, a
 * sensor log's plots), shared by every app instance: the key says what each entry was computed
 * from; entries go with their lab and their fit.
 */
export class Migration20261203140000_block_cache extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "block_cache" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "key" varchar(400) not null, "lab_id" uuid not null, "fit_id" uuid null, "value" jsonb not null, constraint "block_cache_pkey" primary key ("id"));`);
    this.addSql(`alter table "block_cache" add constraint "block_cache_key_unique" unique ("key");`);

    this.addSql(`alter table "block_cache" add constraint "block_cache_lab_id_foreign" foreign key ("lab_id") references "lab" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "block_cache" add constraint "block_cache_fit_id_foreign" foreign key ("fit_id") references "fit" ("id") on update cascade on delete cascade;`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop table if exists "block_cache" cascade;`);
  }

}
