import { Migration } from '@mikro-orm/migrations';

export class Migration20261202013432_colourways extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "dye_profiles" ("id" uuid not null, "created_at" timestamptz not null, "studio_id" uuid not null, "dye_id" uuid not null, "fibre_class" varchar(24) not null, "profile" jsonb not null, "n_dyeings" int not null, "mean_de00" double precision not null, "max_de00" double precision not null, "model_version" int not null default 1, "fitted_at" timestamptz not null, constraint "dye_profiles_pkey" primary key ("id"));`);
    this.addSql(`alter table "dye_profiles" add constraint "dye_profiles_studio_id_dye_id_fibre_class_unique" unique ("studio_id", "dye_id", "fibre_class");`);

    this.addSql(`create table "layer_predictions" ("id" uuid not null, "created_at" timestamptz not null, "studio_id" uuid not null, "layer_id" uuid not null, "profile_versions" jsonb not null, "l" double precision not null, "a" double precision not null, "b" double precision not null, "palette" jsonb not null, "gradient" jsonb null, "based_on" varchar(80) not null, "created_by_id" uuid not null, constraint "layer_predictions_pkey" primary key ("id"));`);
    this.addSql(`create index "layer_predictions_layer_id_created_at_index" on "layer_predictions" ("layer_id", "created_at");`);

    this.addSql(`create table "colourways" ("id" uuid not null, "created_at" timestamptz not null, "studio_id" uuid not null, "name" varchar(120) not null, "description" text not null default '', "status" varchar(12) not null default 'candidate', "target_l" double precision not null, "target_a" double precision not null, "target_b" double precision not null, "target_palette" jsonb not null default '[]', "source_trial_id" uuid not null, "source_reading_id" uuid null, "recipe" jsonb not null, "proposed_by_id" uuid not null, "approved_by_id" uuid null, "approved_at" timestamptz null, "updated_at" timestamptz not null, "version" int not null default 1, constraint "colourways_pkey" primary key ("id"));`);
    this.addSql(`create index "colourways_studio_id_status_index" on "colourways" ("studio_id", "status");`);
    this.addSql(`create index "colourways_studio_id_target_l_target_a_target_b_index" on "colourways" ("studio_id", "target_l", "target_a", "target_b");`);

    this.addSql(`create table "dye_lots" ("id" uuid not null, "created_at" timestamptz not null, "studio_id" uuid not null, "colourway_id" uuid not null, "trial_id" uuid not null, "code" varchar(40) not null, "skeins" int not null, "fibre_weight_g" double precision not null, "reading_id" uuid null, "l" double precision null, "a" double precision null, "b" double precision null, "de00" double precision null, "cmc21" double precision null, "pass" boolean null, "misses" jsonb not null default '[]', "tolerance" double precision not null, "notes" text not null default '', "created_by_id" uuid not null, constraint "dye_lots_pkey" primary key ("id"));`);
    this.addSql(`create index "dye_lots_colourway_id_index" on "dye_lots" ("colourway_id");`);

    this.addSql(`alter table "dye_profiles" add constraint "dye_profiles_studio_id_foreign" foreign key ("studio_id") references "studios" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "dye_profiles" add constraint "dye_profiles_dye_id_foreign" foreign key ("dye_id") references "dyes" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "layer_predictions" add constraint "layer_predictions_studio_id_foreign" foreign key ("studio_id") references "studios" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "layer_predictions" add constraint "layer_predictions_layer_id_foreign" foreign key ("layer_id") references "layers" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "layer_predictions" add constraint "layer_predictions_created_by_id_foreign" foreign key ("created_by_id") references "users" ("id") on update cascade;`);

    this.addSql(`alter table "colourways" add constraint "colourways_studio_id_foreign" foreign key ("studio_id") references "studios" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "colourways" add constraint "colourways_source_trial_id_foreign" foreign key ("source_trial_id") references "trials" ("id") on update cascade;`);
    this.addSql(`alter table "colourways" add constraint "colourways_source_reading_id_foreign" foreign key ("source_reading_id") references "readings" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "colourways" add constraint "colourways_proposed_by_id_foreign" foreign key ("proposed_by_id") references "users" ("id") on update cascade;`);
    this.addSql(`alter table "colourways" add constraint "colourways_approved_by_id_foreign" foreign key ("approved_by_id") references "users" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "dye_lots" add constraint "dye_lots_studio_id_foreign" foreign key ("studio_id") references "studios" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "dye_lots" add constraint "dye_lots_colourway_id_foreign" foreign key ("colourway_id") references "colourways" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "dye_lots" add constraint "dye_lots_trial_id_foreign" foreign key ("trial_id") references "trials" ("id") on update cascade;`);
    this.addSql(`alter table "dye_lots" add constraint "dye_lots_reading_id_foreign" foreign key ("reading_id") references "readings" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "dye_lots" add constraint "dye_lots_created_by_id_foreign" foreign key ("created_by_id") references "users" ("id") on update cascade;`);

    this.addSql(`alter table "comments" add constraint "comments_photo_id_foreign" foreign key ("photo_id") references "photos" ("id") on update cascade on delete set null;`);

    // Hand-written: allowed values checked by the database too.
    this.addSql(`alter table "colourways" add constraint "colourways_status_check" check ("status" in ('candidate', 'repeatable', 'retired'));`);
  }

  override async down(): Promise<void> {
    this.addSql(`alter table "dye_lots" drop constraint "dye_lots_colourway_id_foreign";`);

    this.addSql(`drop table if exists "dye_profiles" cascade;`);

    this.addSql(`drop table if exists "layer_predictions" cascade;`);

    this.addSql(`drop table if exists "colourways" cascade;`);

    this.addSql(`drop table if exists "dye_lots" cascade;`);

    this.addSql(`alter table "comments" drop constraint "comments_photo_id_foreign";`);

  }

}
