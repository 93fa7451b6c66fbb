import { Migration } from '@mikro-orm/migrations';

/**
 * Solar collectors: a trial may carry the irradiance in the collector plane and the wind over the
 * collector (both optional, SI; a sensor log's trials take them as period means, its samples keep
 * the four channels of the import); a saved fit states what it models
 * (`kind`: a heater's outlet against flow, or a collector's efficiency curve), existing fits being
 * heater fits.
 */
export class Migration20261203130000_solar_collector extends Migration {

  override async up(): Promise<void> {
    this.addSql(`alter table "trial" add column "irradiance_w_per_m2" double precision null, add column "wind_m_per_s" double precision null;`);
    this.addSql(`alter table "fit" add column "kind" text check ("kind" in ('heater', 'collector')) not null default 'heater';`);
  }

  override async down(): Promise<void> {
    this.addSql(`alter table "fit" drop column "kind";`);
    this.addSql(`alter table "trial" drop column "irradiance_w_per_m2", drop column "wind_m_per_s";`);
  }

}
