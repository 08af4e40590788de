import { Migration } from '@mikro-orm/migrations';

export class Migration20261202052432_trial_list_order extends Migration {

  // Created with migration:create and trimmed to the trial indexes: the rest of the diff was the
  // hand-written check constraints the entities do not describe. Each sort order of the trial list
  // (updated, created, title) reads a page from its own index, with the id as the tie-break.
  override async up(): Promise<void> {
    this.addSql(`drop index "trials_studio_id_created_at_index";`);
    this.addSql(`create index "trials_studio_id_created_at_id_index" on "trials" ("studio_id", "created_at", "id");`);
    this.addSql(`create index "trials_studio_id_updated_at_id_index" on "trials" ("studio_id", "updated_at", "id");`);
    this.addSql(`create index "trials_studio_id_lower_title_id_index" on "trials" ("studio_id", lower("title"), "id");`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop index "trials_studio_id_created_at_id_index";`);
    this.addSql(`drop index "trials_studio_id_updated_at_id_index";`);
    this.addSql(`drop index "trials_studio_id_lower_title_id_index";`);
    this.addSql(`create index "trials_studio_id_created_at_index" on "trials" ("studio_id", "created_at");`);
  }

}
