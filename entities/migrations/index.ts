/**
 * Every migration, in order. `npm run migration:create` writes a new file here; add it to this
 * list (the list is what runs, so the migrator works from inside the Next bundle too).
 */
import type { MigrationObject } from '@mikro-orm/core';
import { Migration20261201222811 } from './Migration20261201222811';
import { Migration20261201223321_accounts } from './Migration20261201223321_accounts';
import { Migration20261201225447_trial_import } from './Migration20261201225447_trial_import';
import { Migration20261201230509_fits_studies_review } from './Migration20261201230509_fits_studies_review';
import { Migration20261201235511_import_jobs } from './Migration20261201235511_import_jobs';
import { Migration20261202063741_sensor_sample_storage } from './Migration20261202063741_sensor_sample_storage';
import { Migration20261202064527_sensor_overview } from './Migration20261202064527_sensor_overview';
import { Migration20261202090000_sensor_sample_brin } from './Migration20261202090000_sensor_sample_brin';
import { Migration20261203082759_security } from './Migration20261203082759_security';
import { Migration20261203120000_test_sessions } from './Migration20261203120000_test_sessions';
import { Migration20261203123000_comparisons } from './Migration20261203123000_comparisons';
import { Migration20261203130000_solar_collector } from './Migration20261203130000_solar_collector';
import { Migration20261203140000_block_cache } from './Migration20261203140000_block_cache';
import { Migration20261204200000_lookup_indexes } from './Migration20261204200000_lookup_indexes';
import { Migration20261204210000_operating_plans } from './Migration20261204210000_operating_plans';
import { Migration20261204220000_sensor_sample_sun } from './Migration20261204220000_sensor_sample_sun';

export const migrationsList: MigrationObject[] = [
  { name: 'Migration20261201222811', class: Migration20261201222811 },
  { name: 'Migration20261201223321_accounts', class: Migration20261201223321_accounts },
  { name: 'Migration20261201225447_trial_import', class: Migration20261201225447_trial_import },
  { name: 'Migration20261201230509_fits_studies_review', class: Migration20261201230509_fits_studies_review },
  { name: 'Migration20261201235511_import_jobs', class: Migration20261201235511_import_jobs },
  { name: 'Migration20261202063741_sensor_sample_storage', class: Migration20261202063741_sensor_sample_storage },
  { name: 'Migration20261202064527_sensor_overview', class: Migration20261202064527_sensor_overview },
  { name: 'Migration20261202090000_sensor_sample_brin', class: Migration20261202090000_sensor_sample_brin },
  { name: 'Migration20261203082759_security', class: Migration20261203082759_security },
  { name: 'Migration20261203120000_test_sessions', class: Migration20261203120000_test_sessions },
  { name: 'Migration20261203123000_comparisons', class: Migration20261203123000_comparisons },
  { name: 'Migration20261203130000_solar_collector', class: Migration20261203130000_solar_collector },
  { name: 'Migration20261203140000_block_cache', class: Migration20261203140000_block_cache },
  { name: 'Migration20261204200000_lookup_indexes', class: Migration20261204200000_lookup_indexes },
  { name: 'Migration20261204210000_operating_plans', class: Migration20261204210000_operating_plans },
  { name: 'Migration20261204220000_sensor_sample_sun', class: Migration20261204220000_sensor_sample_sun },
];
