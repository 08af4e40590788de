import { Migration } from '@mikro-orm/migrations';

// Rate-limit counters (entities/security.ts). The column list and order are what
// rate-limiter-flexible's Postgres store expects; `expire` is milliseconds since 1970.
export class Migration20261202050458_rate_limits extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "rate_limits" ("key" varchar(255) not null, "points" int not null default 0, "expire" bigint null, constraint "rate_limits_pkey" primary key ("key"));`);
    // The store deletes expired rows by this column.
    this.addSql(`create index "rate_limits_expire_index" on "rate_limits" ("expire");`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop table if exists "rate_limits" cascade;`);
  }

}
