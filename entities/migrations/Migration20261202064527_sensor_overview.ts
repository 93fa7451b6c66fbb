import { Migration } from '@mikro-orm/migrations';

/** Display overviews of sensor logs (LTTB-reduced channels and steady segments), one per imported log. */
export class Migration20261202064527_sensor_overview extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "sensor_overview" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "source_file_id" uuid not null, "rig_id" uuid not null, "started_at" timestamptz not null, "samples" int not null, "duration_s" double precision not null, "max_points" int not null, "points" jsonb not null, "segments" jsonb not null, constraint "sensor_overview_pkey" primary key ("id"));`);
    this.addSql(`alter table "sensor_overview" add constraint "sensor_overview_source_file_id_unique" unique ("source_file_id");`);

    this.addSql(`alter table "sensor_overview" add constraint "sensor_overview_source_file_id_foreign" foreign key ("source_file_id") references "source_file" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "sensor_overview" add constraint "sensor_overview_rig_id_foreign" foreign key ("rig_id") references "rig" ("id") on update cascade on delete cascade;`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop table if exists "sensor_overview" cascade;`);
  }

}
