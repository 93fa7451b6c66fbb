import { Migration } from '@mikro-orm/migrations';

/**
 * Sensor samples keep only their primary key (source file, line). Per million samples written by
 * COPY, the two foreign keys cost about 7 s of row-by-row checks at the end of the statement and
 * the (rig, taken_at) index about 0.7 s of upkeep (and 30 MB), more than the table's own writes;
 * no query reads samples by rig and time. Instead the import locks its source file and rig in its
 * transaction, and triggers delete the samples of a deleted source file or rig as ON DELETE
 * CASCADE did (a rig's samples through its source files: the import sets the file's rig to the
 * rig of its samples in the same transaction). Triggers fire for cascaded deletes too, so
 * deleting a lab removes its samples.
 */
export class Migration20261202063741_sensor_sample_storage extends Migration {

  override async up(): Promise<void> {
    this.addSql(`alter table "sensor_sample" drop constraint "sensor_sample_source_file_id_foreign";`);
    this.addSql(`alter table "sensor_sample" drop constraint "sensor_sample_rig_id_foreign";`);
    this.addSql(`drop index "sensor_sample_rig_id_taken_at_index";`);

    this.addSql(`create function "sensor_sample_delete_of_source_file"() returns trigger language plpgsql as $$
begin
  delete from "sensor_sample" where "source_file_id" = old."id";
  return old;
end $$;`);
    this.addSql(`create trigger "source_file_delete_samples" after delete on "source_file" for each row execute function "sensor_sample_delete_of_source_file"();`);

    // before the row goes, while its files still name it (deleting a rig sets their rig to null)
    this.addSql(`create function "sensor_sample_delete_of_rig"() returns trigger language plpgsql as $$
begin
  delete from "sensor_sample" s using "source_file" f where f."rig_id" = old."id" and s."source_file_id" = f."id";
  return old;
end $$;`);
    this.addSql(`create trigger "rig_delete_samples" before delete on "rig" for each row execute function "sensor_sample_delete_of_rig"();`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop trigger if exists "rig_delete_samples" on "rig";`);
    this.addSql(`drop function if exists "sensor_sample_delete_of_rig"();`);
    this.addSql(`drop trigger if exists "source_file_delete_samples" on "source_file";`);
    this.addSql(`drop function if exists "sensor_sample_delete_of_source_file"();`);

    this.addSql(`create index "sensor_sample_rig_id_taken_at_index" on "sensor_sample" ("rig_id", "taken_at");`);
    this.addSql(`delete from "sensor_sample" s where not exists (select 1 from "source_file" f where f."id" = s."source_file_id") or not exists (select 1 from "rig" r where r."id" = s."rig_id");`);
    this.addSql(`alter table "sensor_sample" add constraint "sensor_sample_source_file_id_foreign" foreign key ("source_file_id") references "source_file" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "sensor_sample" add constraint "sensor_sample_rig_id_foreign" foreign key ("rig_id") references "rig" ("id") on update cascade on delete cascade;`);
  }

}
