CREATE TABLE `instructor_running_values` (
	`instructor_id` integer NOT NULL,
	`quarter` text NOT NULL,
	`tallies` blob NOT NULL,
	`packed_score` blob NOT NULL,
	`packed_depth_ok_pct` blob NOT NULL,
	`packed_rate_ok_pct` blob NOT NULL,
	`packed_recoil_ok_pct` blob NOT NULL,
	`packed_hands_on_pct` blob NOT NULL,
	PRIMARY KEY(`instructor_id`, `quarter`)
);
--> statement-breakpoint
CREATE INDEX `instructor_values_attempts_idx` ON `instructor_values` (`quarter`,`instructor_id`,`attempts`);