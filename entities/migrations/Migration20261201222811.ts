import { Migration } from '@mikro-orm/migrations';

/** Labs, users, memberships, rigs and trials. */
export class Migration20261201222811 extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "lab" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "name" varchar(120) not null, "slug" varchar(80) not null, "unit_system" text check ("unit_system" in ('si', 'us')) not null default 'si', "is_demo" boolean not null default false, constraint "lab_pkey" primary key ("id"));`);
    this.addSql(`alter table "lab" add constraint "lab_slug_unique" unique ("slug");`);

    this.addSql(`create table "rig" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "lab_id" uuid not null, "name" varchar(120) not null, "heat_source" text check ("heat_source" in ('wood-fire', 'propane-burner', 'natural-gas', 'solar-collector', 'electric', 'heat-pump', 'other')) not null, "description" text not null default '', "details" jsonb not null default '{}', "notes" text not null default '', constraint "rig_pkey" primary key ("id"));`);
    this.addSql(`alter table "rig" add constraint "rig_lab_id_name_unique" unique ("lab_id", "name");`);

    this.addSql(`create table "trial" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "lab_id" uuid not null, "rig_id" uuid not null, "started_at" timestamptz not null, "bucket_volume_m3" double precision null, "fill_times_s" jsonb null, "flow_m3_per_s" double precision not null, "inlet_c" double precision not null, "outlet_c" double precision not null, "ambient_c" double precision null, "is_reference" boolean not null default false, "excluded" boolean not null default false, "notes" text not null default '', constraint "trial_pkey" primary key ("id"));`);
    this.addSql(`create index "trial_rig_id_started_at_index" on "trial" ("rig_id", "started_at");`);

    this.addSql(`create table "app_user" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "email" varchar(254) not null, "name" varchar(120) not null, "password_hash" varchar(255) not null, "token_version" int not null default 0, "unit_system" text check ("unit_system" in ('si', 'us')) not null default 'si', constraint "app_user_pkey" primary key ("id"));`);
    this.addSql(`alter table "app_user" add constraint "app_user_email_unique" unique ("email");`);

    this.addSql(`create table "membership" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "user_id" uuid not null, "lab_id" uuid not null, "role" text check ("role" in ('owner', 'engineer', 'reviewer', 'viewer')) not null, constraint "membership_pkey" primary key ("id"));`);
    this.addSql(`alter table "membership" add constraint "membership_user_id_lab_id_unique" unique ("user_id", "lab_id");`);

    this.addSql(`alter table "rig" add constraint "rig_lab_id_foreign" foreign key ("lab_id") references "lab" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "trial" add constraint "trial_lab_id_foreign" foreign key ("lab_id") references "lab" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "trial" add constraint "trial_rig_id_foreign" foreign key ("rig_id") references "rig" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "membership" add constraint "membership_user_id_foreign" foreign key ("user_id") references "app_user" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "membership" add constraint "membership_lab_id_foreign" foreign key ("lab_id") references "lab" ("id") on update cascade on delete cascade;`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop table if exists "membership" cascade;`);
    this.addSql(`drop table if exists "trial" cascade;`);
    this.addSql(`drop table if exists "rig" cascade;`);
    this.addSql(`drop table if exists "app_user" cascade;`);
    this.addSql(`drop table if exists "lab" cascade;`);
  }
}
