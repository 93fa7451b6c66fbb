import { Migration } from '@mikro-orm/migrations';

/**
 * A collector log's samples keep the sun: the irradiance in the collector plane (W/m²) and the
 * wind (m/s) beside the four water and air channels, NULL for coil logs (and for logs imported
 * before). Nullable columns without a default: PostgreSQL adds them without rewriting the table.
 */
export class Migration20261204220000_sensor_sample_sun extends Migration {

  override async up(): Promise<void> {
    this.addSql(`alter table "sensor_sample" add column "irradiance_w_per_m2" double precision null, add column "wind_m_per_s" double precision null;`);
  }

  override async down(): Promise<void> {
    this.addSql(`alter table "sensor_sample" drop column "irradiance_w_per_m2", drop column "wind_m_per_s";`);
  }

}
