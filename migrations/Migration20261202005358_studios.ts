import { Migration } from '@mikro-orm/migrations';

export class Migration20261202005358_studios extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "studios" ("id" uuid not null, "created_at" timestamptz not null, "name" varchar(120) not null, "lot_tolerance" double precision not null default 1, "lots_for_repeatable" int not null default 2, "stock_shelf_life_days" int not null default 60, constraint "studios_pkey" primary key ("id"));`);

    this.addSql(`create table "users" ("id" uuid not null, "created_at" timestamptz not null, "email" varchar(254) not null, "name" varchar(120) not null, "password_hash" varchar(255) null, "email_verified" timestamptz null, "unit_system" varchar(8) not null default 'metric', "temperature_unit" varchar(1) not null default 'C', "mail_enabled" boolean not null default true, constraint "users_pkey" primary key ("id"));`);
    this.addSql(`alter table "users" add constraint "users_email_unique" unique ("email");`);

    this.addSql(`create table "memberships" ("id" uuid not null, "created_at" timestamptz not null, "studio_id" uuid not null, "user_id" uuid not null, "role" varchar(8) not null, constraint "memberships_pkey" primary key ("id"));`);
    this.addSql(`alter table "memberships" add constraint "memberships_studio_id_user_id_unique" unique ("studio_id", "user_id");`);

    this.addSql(`create table "invitations" ("id" uuid not null, "created_at" timestamptz not null, "studio_id" uuid not null, "email" varchar(254) not null, "role" varchar(8) not null, "token_hash" varchar(64) not null, "invited_by_id" uuid not null, "expires_at" timestamptz not null, "accepted_at" timestamptz null, "revoked_at" timestamptz null, constraint "invitations_pkey" primary key ("id"));`);
    this.addSql(`alter table "invitations" add constraint "invitations_token_hash_unique" unique ("token_hash");`);

    this.addSql(`create table "verification_tokens" ("identifier" varchar(254) not null, "token" varchar(255) not null, "expires" timestamptz not null, constraint "verification_tokens_pkey" primary key ("identifier", "token"));`);

    this.addSql(`alter table "memberships" add constraint "memberships_studio_id_foreign" foreign key ("studio_id") references "studios" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "memberships" add constraint "memberships_user_id_foreign" foreign key ("user_id") references "users" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "invitations" add constraint "invitations_studio_id_foreign" foreign key ("studio_id") references "studios" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "invitations" add constraint "invitations_invited_by_id_foreign" foreign key ("invited_by_id") references "users" ("id") on update cascade on delete cascade;`);

    // Hand-written: role values checked by the database too, and the lookups the app makes.
    this.addSql(`alter table "memberships" add constraint "memberships_role_check" check ("role" in ('owner', 'dyer', 'guest'));`);
    this.addSql(`alter table "invitations" add constraint "invitations_role_check" check ("role" in ('owner', 'dyer', 'guest'));`);
    this.addSql(`create index "memberships_user_id_index" on "memberships" ("user_id");`);
    this.addSql(`create index "invitations_studio_id_index" on "invitations" ("studio_id");`);
  }

}
