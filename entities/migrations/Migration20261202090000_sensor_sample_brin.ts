import { Migration } from '@mikro-orm/migrations';

/**
 * Sensor samples are kept in a block-range (BRIN) index on (source file, line) instead of a B-tree
 * primary key. Samples are appended by one COPY per file in line order and never updated, so rows
 * of a file sit together on disk and a BRIN index (a few pages per million rows) finds them as
 * well as a B-tree does, while a B-tree key costs PostgreSQL as much work as the rows themselves
 * during the COPY (about 0.7 s of CPU per million samples here).
 *
 * (source file, line) stays unique by construction: a file is imported once, in one transaction
 * that holds its `source_file` row FOR UPDATE and marks it imported, and within the file every
 * line number is emitted once, in increasing order (app/_lib/imports/sensor-import.ts).
 */
export class Migration20261202090000_sensor_sample_brin extends Migration {

  override async up(): Promise<void> {
    this.addSql(`alter table "sensor_sample" drop constraint "sensor_sample_pkey";`);
    this.addSql(`create index "sensor_sample_file_line_brin" on "sensor_sample" using brin ("source_file_id", "line") with (pages_per_range = 32);`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop index if exists "sensor_sample_file_line_brin";`);
    this.addSql(`alter table "sensor_sample" add constraint "sensor_sample_pkey" primary key ("source_file_id", "line");`);
  }

}
