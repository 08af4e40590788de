// Every migration, listed by hand in the order they run (no file access in the production build).
import type { MigrationObject } from "@mikro-orm/core";
import { Migration20261202005358_studios } from "./Migration20261202005358_studios";
import { Migration20261202010701_trials } from "./Migration20261202010701_trials";
import { Migration20261202011047_photos } from "./Migration20261202011047_photos";
import { Migration20261202011154_comments } from "./Migration20261202011154_comments";
import { Migration20261202013432_colourways } from "./Migration20261202013432_colourways";
import { Migration20261202050458_rate_limits } from "./Migration20261202050458_rate_limits";
import { Migration20261202052432_trial_list_order } from "./Migration20261202052432_trial_list_order";

export const migrationsList: MigrationObject[] = [
  { name: "Migration20261202005358_studios", class: Migration20261202005358_studios },
  { name: "Migration20261202010701_trials", class: Migration20261202010701_trials },
  { name: "Migration20261202011047_photos", class: Migration20261202011047_photos },
  { name: "Migration20261202011154_comments", class: Migration20261202011154_comments },
  { name: "Migration20261202013432_colourways", class: Migration20261202013432_colourways },
  { name: "Migration20261202050458_rate_limits", class: Migration20261202050458_rate_limits },
  { name: "Migration20261202052432_trial_list_order", class: Migration20261202052432_trial_list_order },
];
