CREATE TABLE `attempt_tallies` (
	`quarter` text NOT NULL,
	`site_id` integer NOT NULL,
	`instructor_id` integer NOT NULL,
	`manikin_id` integer NOT NULL,
	`profile` text NOT NULL,
	`feedback` text NOT NULL,
	`policy_version` integer NOT NULL,
	`n` integer NOT NULL,
	`passed` integer NOT NULL,
	`judged_pp` integer NOT NULL,
	`judged_pf` integer NOT NULL,
	`judged_fp` integer NOT NULL,
	`judged_ff` integer NOT NULL,
	`with_errors` integer NOT NULL,
	`compressions` integer NOT NULL,
	`err_too_shallow` integer NOT NULL,
	`err_too_deep` integer NOT NULL,
	`err_too_slow` integer NOT NULL,
	`err_too_fast` integer NOT NULL,
	`err_incomplete_recoil` integer NOT NULL,
	`err_low_hands_on` integer NOT NULL,
	`err_long_pause` integer NOT NULL,
	PRIMARY KEY(`quarter`, `profile`, `feedback`, `site_id`, `instructor_id`, `manikin_id`, `policy_version`)
) WITHOUT ROWID;
--> statement-breakpoint
CREATE INDEX `attempt_tallies_instructor_idx` ON `attempt_tallies` (`instructor_id`,`quarter`);--> statement-breakpoint
CREATE TABLE `attempt_values` (
	`metric` text NOT NULL,
	`quarter` text NOT NULL,
	`instructor_id` integer NOT NULL,
	`profile` text NOT NULL,
	`feedback` text NOT NULL,
	`site_id` integer NOT NULL,
	`manikin_id` integer NOT NULL,
	`value` real NOT NULL,
	`count` integer NOT NULL,
	PRIMARY KEY(`metric`, `quarter`, `instructor_id`, `value`, `profile`, `feedback`, `site_id`, `manikin_id`)
) WITHOUT ROWID;
--> statement-breakpoint
CREATE INDEX `attempt_values_instructor_idx` ON `attempt_values` (`metric`,`instructor_id`,`quarter`);--> statement-breakpoint
CREATE INDEX `attempt_values_site_idx` ON `attempt_values` (`metric`,`site_id`,`quarter`);--> statement-breakpoint
CREATE TABLE `learner_quarters` (
	`quarter` text NOT NULL,
	`learner` text NOT NULL,
	`attempts` integer NOT NULL,
	`passed` integer NOT NULL,
	`first_started` text NOT NULL,
	`first_id` text NOT NULL,
	`first_passed` integer NOT NULL,
	`prev_quarter` text,
	`prev_pass_quarter` text,
	PRIMARY KEY(`quarter`, `learner`)
) WITHOUT ROWID;
--> statement-breakpoint
CREATE INDEX `learner_quarters_learner_idx` ON `learner_quarters` (`learner`,`quarter`);--> statement-breakpoint
CREATE TABLE `learner_tallies` (
	`quarter` text NOT NULL,
	`learner` text NOT NULL,
	`profile` text NOT NULL,
	`feedback` text NOT NULL,
	`site_id` integer NOT NULL,
	`instructor_id` integer NOT NULL,
	`manikin_id` integer NOT NULL,
	`attempts` integer NOT NULL,
	`passed` integer NOT NULL,
	`first_started` text NOT NULL,
	`first_id` text NOT NULL,
	`first_passed` integer NOT NULL,
	PRIMARY KEY(`quarter`, `learner`, `profile`, `feedback`, `site_id`, `instructor_id`, `manikin_id`)
) WITHOUT ROWID;
--> statement-breakpoint
CREATE INDEX `learner_tallies_instructor_idx` ON `learner_tallies` (`instructor_id`,`quarter`);--> statement-breakpoint
CREATE TABLE `network_tallies` (
	`quarter` text NOT NULL,
	`profile` text NOT NULL,
	`feedback` text NOT NULL,
	`policy_version` integer NOT NULL,
	`n` integer NOT NULL,
	`passed` integer NOT NULL,
	`judged_pp` integer NOT NULL,
	`judged_pf` integer NOT NULL,
	`judged_fp` integer NOT NULL,
	`judged_ff` integer NOT NULL,
	`with_errors` integer NOT NULL,
	`compressions` integer NOT NULL,
	`err_too_shallow` integer NOT NULL,
	`err_too_deep` integer NOT NULL,
	`err_too_slow` integer NOT NULL,
	`err_too_fast` integer NOT NULL,
	`err_incomplete_recoil` integer NOT NULL,
	`err_low_hands_on` integer NOT NULL,
	`err_long_pause` integer NOT NULL,
	PRIMARY KEY(`quarter`, `profile`, `feedback`, `policy_version`)
) WITHOUT ROWID;
--> statement-breakpoint
CREATE TABLE `network_values` (
	`metric` text NOT NULL,
	`quarter` text NOT NULL,
	`profile` text NOT NULL,
	`feedback` text NOT NULL,
	`value` real NOT NULL,
	`count` integer NOT NULL,
	PRIMARY KEY(`metric`, `quarter`, `profile`, `feedback`, `value`)
) WITHOUT ROWID;
--> statement-breakpoint
CREATE TABLE `summary_deferral` (
	`id` integer PRIMARY KEY NOT NULL
);
--> statement-breakpoint
CREATE TABLE `summary_pending` (
	`id` text PRIMARY KEY NOT NULL
) WITHOUT ROWID;
--> statement-breakpoint
DROP INDEX `attempts_instructor_score_idx`;--> statement-breakpoint
DROP INDEX `attempts_insight_idx`;--> statement-breakpoint
CREATE INDEX `attempts_learner_idx` ON `attempts` (`learner`,`quarter`);