import { Migration } from '@mikro-orm/migrations';

export class Migration20261202011047_photos extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "reference_cards" ("id" uuid not null, "created_at" timestamptz not null, "studio_id" uuid not null, "name" varchar(120) not null, "rows" int not null, "cols" int not null, "patches" jsonb not null, "measured" boolean not null default false, "notes" text not null default '', "updated_at" timestamptz not null, "version" int not null default 1, constraint "reference_cards_pkey" primary key ("id"));`);
    this.addSql(`create index "reference_cards_studio_id_index" on "reference_cards" ("studio_id");`);

    this.addSql(`create table "photos" ("id" uuid not null, "created_at" timestamptz not null, "studio_id" uuid not null, "trial_id" uuid not null, "layer_id" uuid null, "kind" varchar(12) not null, "uploaded_by_id" uuid not null, "status" varchar(8) not null, "upload_key" varchar(200) not null, "master_key" varchar(200) null, "web_key" varchar(200) null, "thumb_key" varchar(200) null, "width" int null, "height" int null, "bytes" int null, "original_type" varchar(40) null, "confirmed_at" timestamptz null, constraint "photos_pkey" primary key ("id"));`);
    this.addSql(`create index "photos_trial_id_index" on "photos" ("trial_id");`);
    this.addSql(`create index "photos_status_created_at_index" on "photos" ("status", "created_at");`);

    this.addSql(`create table "readings" ("id" uuid not null, "created_at" timestamptz not null, "studio_id" uuid not null, "trial_id" uuid not null, "layer_id" uuid null, "photo_id" uuid not null, "card_id" uuid null, "card_version" int null, "model_version" int not null, "label" varchar(80) not null default '', "corners" jsonb null, "region" jsonb not null, "l" double precision not null, "a" double precision not null, "b" double precision not null, "palette" jsonb not null, "calibration" jsonb null, "created_by_id" uuid not null, "updated_at" timestamptz not null, constraint "readings_pkey" primary key ("id"));`);
    this.addSql(`create index "readings_trial_id_index" on "readings" ("trial_id");`);
    this.addSql(`create index "readings_photo_id_index" on "readings" ("photo_id");`);
    this.addSql(`create index "readings_studio_id_l_a_b_index" on "readings" ("studio_id", "l", "a", "b");`);

    this.addSql(`alter table "reference_cards" add constraint "reference_cards_studio_id_foreign" foreign key ("studio_id") references "studios" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "photos" add constraint "photos_studio_id_foreign" foreign key ("studio_id") references "studios" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "photos" add constraint "photos_trial_id_foreign" foreign key ("trial_id") references "trials" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "photos" add constraint "photos_layer_id_foreign" foreign key ("layer_id") references "layers" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "photos" add constraint "photos_uploaded_by_id_foreign" foreign key ("uploaded_by_id") references "users" ("id") on update cascade;`);

    this.addSql(`alter table "readings" add constraint "readings_studio_id_foreign" foreign key ("studio_id") references "studios" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "readings" add constraint "readings_trial_id_foreign" foreign key ("trial_id") references "trials" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "readings" add constraint "readings_layer_id_foreign" foreign key ("layer_id") references "layers" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "readings" add constraint "readings_photo_id_foreign" foreign key ("photo_id") references "photos" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "readings" add constraint "readings_card_id_foreign" foreign key ("card_id") references "reference_cards" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "readings" add constraint "readings_created_by_id_foreign" foreign key ("created_by_id") references "users" ("id") on update cascade;`);

    this.addSql(`alter table "dyes" drop constraint if exists "dyes_dye_class_check";`);

    this.addSql(`alter table "trials" drop constraint if exists "trials_status_check";`);

    this.addSql(`alter table "layers" drop constraint if exists "layers_method_check";`);

    this.addSql(`alter table "step_timers" drop constraint if exists "step_timers_state_check";`);

    this.addSql(`alter table "dyes" alter column "dye_class" type varchar(16) using ("dye_class"::varchar(16));`);

    this.addSql(`drop index "trials_tags_gin";`);

    this.addSql(`alter table "trials" alter column "status" type varchar(12) using ("status"::varchar(12));`);

    this.addSql(`drop index "layers_dyes_gin";`);

    this.addSql(`alter table "layers" alter column "method" type varchar(12) using ("method"::varchar(12));`);

    this.addSql(`alter table "step_timers" alter column "state" type varchar(10) using ("state"::varchar(10));`);

    // Hand-written: allowed values checked by the database too.
    this.addSql(`alter table "photos" add constraint "photos_kind_check" check ("kind" in ('base', 'after-layer', 'final', 'before-wash', 'after-wash'));`);
    this.addSql(`alter table "photos" add constraint "photos_status_check" check ("status" in ('pending', 'ready'));`);
  }

  override async down(): Promise<void> {
    this.addSql(`alter table "readings" drop constraint "readings_card_id_foreign";`);

    this.addSql(`alter table "readings" drop constraint "readings_photo_id_foreign";`);

    this.addSql(`drop table if exists "reference_cards" cascade;`);

    this.addSql(`drop table if exists "photos" cascade;`);

    this.addSql(`drop table if exists "readings" cascade;`);

    this.addSql(`alter table "dyes" add constraint "dyes_dye_class_check" check("dye_class" in ('acid', 'food', 'reactive', 'other'));`);

    this.addSql(`alter table "layers" add constraint "layers_method_check" check("method" in ('immersion', 'kettle', 'dip', 'hand-paint', 'speckle', 'dry', 'other'));`);
    this.addSql(`create index "layers_dyes_gin" on "layers" ("dyes");`);

    this.addSql(`alter table "step_timers" add constraint "step_timers_state_check" check("state" in ('running', 'paused', 'done', 'cancelled'));`);

    this.addSql(`alter table "trials" add constraint "trials_status_check" check("status" in ('planned', 'in-progress', 'done'));`);
    this.addSql(`create index "trials_tags_gin" on "trials" ("tags");`);
  }

}
