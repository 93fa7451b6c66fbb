import { Migration } from '@mikro-orm/migrations';

/**
 * Operating plans: a rig's ordered steps of running it (pump, valves, flow, fire, waits, cover)
 * and its loop's facts. The cautions are computed when a plan is read, never stored.
 */
export class Migration20261204210000_operating_plans extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "operating_plan" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "lab_id" uuid not null, "rig_id" uuid not null, "created_by_id" uuid null, "name" varchar(120) not null, "steps" jsonb not null, "loop" jsonb not null, constraint "operating_plan_pkey" primary key ("id"));`);
    this.addSql(`create index "operating_plan_rig_id_created_at_index" on "operating_plan" ("rig_id", "created_at");`);
    this.addSql(`alter table "operating_plan" add constraint "operating_plan_lab_id_foreign" foreign key ("lab_id") references "lab" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "operating_plan" add constraint "operating_plan_rig_id_foreign" foreign key ("rig_id") references "rig" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "operating_plan" add constraint "operating_plan_created_by_id_foreign" foreign key ("created_by_id") references "app_user" ("id") on update cascade on delete set null;`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop table if exists "operating_plan" cascade;`);
  }

}
