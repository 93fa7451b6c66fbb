import { Migration } from '@mikro-orm/migrations';

/**
 * Indexes for the lookups every page makes: a user's sessions, a study's share links, a rig's
 * files and imports (each was a scan of the whole table).
 */
export class Migration20261204200000_lookup_indexes extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create index "session_user_id_index" on "session" ("user_id");`);
    this.addSql(`create index "share_link_study_id_created_at_index" on "share_link" ("study_id", "created_at");`);
    this.addSql(`create index "source_file_rig_id_purpose_created_at_index" on "source_file" ("rig_id", "purpose", "created_at");`);
    this.addSql(`create index "import_job_rig_id_created_at_index" on "import_job" ("rig_id", "created_at");`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop index if exists "session_user_id_index";`);
    this.addSql(`drop index if exists "share_link_study_id_created_at_index";`);
    this.addSql(`drop index if exists "source_file_rig_id_purpose_created_at_index";`);
    this.addSql(`drop index if exists "import_job_rig_id_created_at_index";`);
  }

}
