import { Migration } from '@mikro-orm/migrations';

export class Migration20261202010701_trials extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "dyes" ("id" uuid not null, "created_at" timestamptz not null, "studio_id" uuid not null, "name" varchar(120) not null, "dye_class" varchar(16) not null, "form" varchar(8) not null, "colour_index_name" varchar(60) null, "sds_url" varchar(500) null, "display_hex" varchar(7) null, "notes" text not null default '', "archived" boolean not null default false, "version" int not null default 1, constraint "dyes_pkey" primary key ("id"));`);
    this.addSql(`create index "dyes_studio_id_index" on "dyes" ("studio_id");`);

    this.addSql(`create table "stock_solutions" ("id" uuid not null, "created_at" timestamptz not null, "studio_id" uuid not null, "dye_id" uuid not null, "concentration_pct" double precision not null, "definition" varchar(10) not null, "volume_ml" double precision not null, "mixed_on" date not null, "powder_lot" varchar(60) not null default '', "notes" text not null default '', "archived" boolean not null default false, "version" int not null default 1, constraint "stock_solutions_pkey" primary key ("id"));`);
    this.addSql(`create index "stock_solutions_studio_id_index" on "stock_solutions" ("studio_id");`);

    this.addSql(`create table "yarn_bases" ("id" uuid not null, "created_at" timestamptz not null, "studio_id" uuid not null, "name" varchar(120) not null, "fibres" jsonb not null, "superwash" boolean not null default false, "weight_class" varchar(16) not null, "metres_per100g" double precision null, "notes" text not null default '', "archived" boolean not null default false, "version" int not null default 1, constraint "yarn_bases_pkey" primary key ("id"));`);
    this.addSql(`create index "yarn_bases_studio_id_index" on "yarn_bases" ("studio_id");`);

    this.addSql(`create table "trials" ("id" uuid not null, "created_at" timestamptz not null, "studio_id" uuid not null, "author_id" uuid not null, "title" varchar(160) not null, "base_id" uuid null, "fibre_weight_g" double precision not null, "status" varchar(12) not null default 'planned', "tags" jsonb not null default '[]', "notes" jsonb null, "notes_text" text not null default '', "copied_from_id" uuid null, "updated_at" timestamptz not null, "version" int not null default 1, constraint "trials_pkey" primary key ("id"));`);
    this.addSql(`create index "trials_studio_id_created_at_index" on "trials" ("studio_id", "created_at");`);

    this.addSql(`create table "layers" ("id" uuid not null, "created_at" timestamptz not null, "trial_id" uuid not null, "position" int not null, "method" varchar(12) not null, "dyes" jsonb not null default '[]', "acid" jsonb not null default '{"kind":"vinegar"}', "water_l" double precision null, "temperature_c" double precision null, "minutes" double precision null, "setting" jsonb not null default '{"method":"none"}', "rinse_note" text not null default '', "bled" boolean null, "coverage" double precision null, "gradient" jsonb null, "observations" text not null default '', "updated_at" timestamptz not null, "version" int not null default 1, constraint "layers_pkey" primary key ("id"));`);
    this.addSql(`create index "layers_trial_id_position_index" on "layers" ("trial_id", "position");`);

    this.addSql(`create table "step_timers" ("id" uuid not null, "created_at" timestamptz not null, "studio_id" uuid not null, "trial_id" uuid not null, "layer_id" uuid null, "started_by_id" uuid not null, "label" varchar(80) not null, "duration_sec" int not null, "elapsed_sec" double precision not null default 0, "running_since" timestamptz null, "state" varchar(10) not null, "finished_at" timestamptz null, "version" int not null default 1, constraint "step_timers_pkey" primary key ("id"));`);
    this.addSql(`create index "step_timers_studio_id_state_index" on "step_timers" ("studio_id", "state");`);

    this.addSql(`alter table "dyes" add constraint "dyes_studio_id_foreign" foreign key ("studio_id") references "studios" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "stock_solutions" add constraint "stock_solutions_studio_id_foreign" foreign key ("studio_id") references "studios" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "stock_solutions" add constraint "stock_solutions_dye_id_foreign" foreign key ("dye_id") references "dyes" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "yarn_bases" add constraint "yarn_bases_studio_id_foreign" foreign key ("studio_id") references "studios" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "trials" add constraint "trials_studio_id_foreign" foreign key ("studio_id") references "studios" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "trials" add constraint "trials_author_id_foreign" foreign key ("author_id") references "users" ("id") on update cascade;`);
    this.addSql(`alter table "trials" add constraint "trials_base_id_foreign" foreign key ("base_id") references "yarn_bases" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "trials" add constraint "trials_copied_from_id_foreign" foreign key ("copied_from_id") references "trials" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "layers" add constraint "layers_trial_id_foreign" foreign key ("trial_id") references "trials" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "step_timers" add constraint "step_timers_studio_id_foreign" foreign key ("studio_id") references "studios" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "step_timers" add constraint "step_timers_trial_id_foreign" foreign key ("trial_id") references "trials" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "step_timers" add constraint "step_timers_layer_id_foreign" foreign key ("layer_id") references "layers" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "step_timers" add constraint "step_timers_started_by_id_foreign" foreign key ("started_by_id") references "users" ("id") on update cascade;`);

    this.addSql(`alter table "memberships" drop constraint if exists "memberships_role_check";`);

    this.addSql(`alter table "invitations" drop constraint if exists "invitations_role_check";`);

    this.addSql(`drop index "memberships_user_id_index";`);

    this.addSql(`alter table "memberships" alter column "role" type varchar(8) using ("role"::varchar(8));`);

    this.addSql(`drop index "invitations_studio_id_index";`);

    this.addSql(`alter table "invitations" alter column "role" type varchar(8) using ("role"::varchar(8));`);

    // Hand-written: allowed values checked by the database too, and the indexes the trial list uses.
    this.addSql(`alter table "trials" add constraint "trials_status_check" check ("status" in ('planned', 'in-progress', 'done'));`);
    this.addSql(`alter table "layers" add constraint "layers_method_check" check ("method" in ('immersion', 'kettle', 'dip', 'hand-paint', 'speckle', 'dry', 'other'));`);
    this.addSql(`alter table "step_timers" add constraint "step_timers_state_check" check ("state" in ('running', 'paused', 'done', 'cancelled'));`);
    this.addSql(`alter table "dyes" add constraint "dyes_class_check" check ("dye_class" in ('acid', 'food', 'reactive', 'other'));`);
    this.addSql(`create index "layers_dyes_gin" on "layers" using gin ("dyes" jsonb_path_ops);`);
    this.addSql(`create index "trials_tags_gin" on "trials" using gin ("tags" jsonb_path_ops);`);
  }

  override async down(): Promise<void> {
    this.addSql(`alter table "stock_solutions" drop constraint "stock_solutions_dye_id_foreign";`);

    this.addSql(`alter table "trials" drop constraint "trials_base_id_foreign";`);

    this.addSql(`alter table "trials" drop constraint "trials_copied_from_id_foreign";`);

    this.addSql(`alter table "layers" drop constraint "layers_trial_id_foreign";`);

    this.addSql(`alter table "step_timers" drop constraint "step_timers_trial_id_foreign";`);

    this.addSql(`alter table "step_timers" drop constraint "step_timers_layer_id_foreign";`);

    this.addSql(`drop table if exists "dyes" cascade;`);

    this.addSql(`drop table if exists "stock_solutions" cascade;`);

    this.addSql(`drop table if exists "yarn_bases" cascade;`);

    this.addSql(`drop table if exists "trials" cascade;`);

    this.addSql(`drop table if exists "layers" cascade;`);

    this.addSql(`drop table if exists "step_timers" cascade;`);

    this.addSql(`alter table "invitations" add constraint "invitations_role_check" check("role" in ('owner', 'dyer', 'guest'));`);
    this.addSql(`create index "invitations_studio_id_index" on "invitations" ("studio_id");`);

    this.addSql(`alter table "memberships" add constraint "memberships_role_check" check("role" in ('owner', 'dyer', 'guest'));`);
    this.addSql(`create index "memberships_user_id_index" on "memberships" ("user_id");`);
  }

}
