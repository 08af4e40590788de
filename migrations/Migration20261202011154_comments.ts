import { Migration } from '@mikro-orm/migrations';

export class Migration20261202011154_comments extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "mail_outbox" ("id" uuid not null, "created_at" timestamptz not null, "user_id" uuid null, "to" varchar(254) not null, "subject" varchar(300) not null, "text" text not null, "html" text null, "batch_key" varchar(80) null, "send_after" timestamptz not null, "sent_at" timestamptz null, "attempts" int not null default 0, "last_error" varchar(500) null, constraint "mail_outbox_pkey" primary key ("id"));`);
    this.addSql(`create index "mail_outbox_sent_at_send_after_index" on "mail_outbox" ("sent_at", "send_after");`);
    this.addSql(`create index "mail_outbox_batch_key_index" on "mail_outbox" ("batch_key");`);

    this.addSql(`create table "follows" ("id" uuid not null, "created_at" timestamptz not null, "user_id" uuid not null, "studio_id" uuid not null, "target_type" varchar(16) not null, "target_id" uuid not null, constraint "follows_pkey" primary key ("id"));`);
    this.addSql(`create index "follows_target_type_target_id_index" on "follows" ("target_type", "target_id");`);
    this.addSql(`alter table "follows" add constraint "follows_user_id_target_type_target_id_unique" unique ("user_id", "target_type", "target_id");`);

    this.addSql(`create table "activity_events" ("id" uuid not null, "created_at" timestamptz not null, "studio_id" uuid not null, "actor_id" uuid null, "kind" varchar(32) not null, "trial_id" uuid null, "layer_id" uuid null, "comment_id" uuid null, "colourway_id" uuid null, "subject_id" uuid null, "summary" varchar(300) not null, constraint "activity_events_pkey" primary key ("id"));`);
    this.addSql(`create index "activity_events_studio_id_created_at_index" on "activity_events" ("studio_id", "created_at");`);

    this.addSql(`create table "comments" ("id" uuid not null, "created_at" timestamptz not null, "studio_id" uuid not null, "trial_id" uuid not null, "layer_id" uuid null, "photo_id" uuid null, "author_id" uuid not null, "body" jsonb not null, "body_text" text not null default '', "mentions" jsonb not null default '[]', "edited_at" timestamptz null, "deleted_at" timestamptz null, "updated_at" timestamptz not null, "version" int not null default 1, constraint "comments_pkey" primary key ("id"));`);
    this.addSql(`create index "comments_trial_id_created_at_index" on "comments" ("trial_id", "created_at");`);
    this.addSql(`create index "comments_studio_id_created_at_index" on "comments" ("studio_id", "created_at");`);

    this.addSql(`create table "notifications" ("id" uuid not null, "created_at" timestamptz not null, "user_id" uuid not null, "studio_id" uuid not null, "kind" varchar(24) not null, "actor_id" uuid null, "trial_id" uuid null, "comment_id" uuid null, "activity_id" uuid null, "summary" varchar(300) not null, "read_at" timestamptz null, constraint "notifications_pkey" primary key ("id"));`);
    this.addSql(`create index "notifications_user_id_studio_id_created_at_index" on "notifications" ("user_id", "studio_id", "created_at");`);

    this.addSql(`alter table "mail_outbox" add constraint "mail_outbox_user_id_foreign" foreign key ("user_id") references "users" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "follows" add constraint "follows_user_id_foreign" foreign key ("user_id") references "users" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "follows" add constraint "follows_studio_id_foreign" foreign key ("studio_id") references "studios" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "activity_events" add constraint "activity_events_studio_id_foreign" foreign key ("studio_id") references "studios" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "activity_events" add constraint "activity_events_actor_id_foreign" foreign key ("actor_id") references "users" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "comments" add constraint "comments_studio_id_foreign" foreign key ("studio_id") references "studios" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "comments" add constraint "comments_trial_id_foreign" foreign key ("trial_id") references "trials" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "comments" add constraint "comments_layer_id_foreign" foreign key ("layer_id") references "layers" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "comments" add constraint "comments_author_id_foreign" foreign key ("author_id") references "users" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "notifications" add constraint "notifications_user_id_foreign" foreign key ("user_id") references "users" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "notifications" add constraint "notifications_studio_id_foreign" foreign key ("studio_id") references "studios" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "notifications" add constraint "notifications_actor_id_foreign" foreign key ("actor_id") references "users" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "notifications" add constraint "notifications_trial_id_foreign" foreign key ("trial_id") references "trials" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "notifications" add constraint "notifications_comment_id_foreign" foreign key ("comment_id") references "comments" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "notifications" add constraint "notifications_activity_id_foreign" foreign key ("activity_id") references "activity_events" ("id") on update cascade on delete cascade;`);
  }

  override async down(): Promise<void> {
    this.addSql(`alter table "notifications" drop constraint "notifications_activity_id_foreign";`);

    this.addSql(`alter table "notifications" drop constraint "notifications_comment_id_foreign";`);

    this.addSql(`drop table if exists "mail_outbox" cascade;`);

    this.addSql(`drop table if exists "follows" cascade;`);

    this.addSql(`drop table if exists "activity_events" cascade;`);

    this.addSql(`drop table if exists "comments" cascade;`);

    this.addSql(`drop table if exists "notifications" cascade;`);
  }

}
