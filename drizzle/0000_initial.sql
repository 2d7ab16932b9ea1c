CREATE TABLE `attempts` (
	`id` text PRIMARY KEY NOT NULL,
	`class_id` text NOT NULL,
	`learner` text NOT NULL,
	`manikin_id` integer,
	`profile` text NOT NULL,
	`feedback` text NOT NULL,
	`started_at` text NOT NULL,
	`quarter` text NOT NULL,
	`site_id` integer NOT NULL,
	`instructor_id` integer NOT NULL,
	`duration_s` real NOT NULL,
	`compressions` integer NOT NULL,
	`rate_cpm` real NOT NULL,
	`depth_mm` real NOT NULL,
	`depth_ok_pct` real NOT NULL,
	`too_shallow_pct` real NOT NULL,
	`too_deep_pct` real NOT NULL,
	`rate_ok_pct` real NOT NULL,
	`too_slow_pct` real NOT NULL,
	`too_fast_pct` real NOT NULL,
	`recoil_ok_pct` real NOT NULL,
	`hands_on_pct` real NOT NULL,
	`longest_pause_s` real NOT NULL,
	`pauses` integer,
	`pauses_over10s` integer,
	`instructor_result` text,
	`source` text NOT NULL,
	`score` real NOT NULL,
	`passed` integer NOT NULL,
	`error_mask` integer NOT NULL,
	`policy_version` integer NOT NULL,
	`batch_id` integer,
	FOREIGN KEY (`class_id`) REFERENCES `classes`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`manikin_id`) REFERENCES `manikins`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`policy_version`) REFERENCES `policy_versions`(`version`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`batch_id`) REFERENCES `import_batches`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `attempts_quarter_idx` ON `attempts` (`quarter`,`profile`,`feedback`);--> statement-breakpoint
CREATE INDEX `attempts_instructor_idx` ON `attempts` (`instructor_id`,`quarter`);--> statement-breakpoint
CREATE INDEX `attempts_site_idx` ON `attempts` (`site_id`,`quarter`);--> statement-breakpoint
CREATE INDEX `attempts_class_idx` ON `attempts` (`class_id`);--> statement-breakpoint
CREATE INDEX `attempts_manikin_idx` ON `attempts` (`manikin_id`,`quarter`);--> statement-breakpoint
CREATE INDEX `attempts_batch_idx` ON `attempts` (`batch_id`);--> statement-breakpoint
CREATE TABLE `batch_changes` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`batch_id` integer NOT NULL,
	`table_name` text NOT NULL,
	`row_key` text NOT NULL,
	`previous` text NOT NULL,
	FOREIGN KEY (`batch_id`) REFERENCES `import_batches`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `batch_changes_batch_idx` ON `batch_changes` (`batch_id`);--> statement-breakpoint
CREATE TABLE `classes` (
	`id` text PRIMARY KEY NOT NULL,
	`date` text NOT NULL,
	`quarter` text NOT NULL,
	`site_id` integer NOT NULL,
	`instructor_id` integer NOT NULL,
	`course` text NOT NULL,
	`learners` integer NOT NULL,
	`passed` integer NOT NULL,
	`manikins` text DEFAULT '' NOT NULL,
	`lungs_replaced` integer,
	`mouthpieces_cleaned` integer,
	`batteries_replaced` integer,
	`batch_id` integer,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`instructor_id`) REFERENCES `instructors`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`batch_id`) REFERENCES `import_batches`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `classes_quarter_idx` ON `classes` (`quarter`);--> statement-breakpoint
CREATE INDEX `classes_instructor_idx` ON `classes` (`instructor_id`,`quarter`);--> statement-breakpoint
CREATE INDEX `classes_site_idx` ON `classes` (`site_id`,`quarter`);--> statement-breakpoint
CREATE TABLE `compression_streams` (
	`attempt_id` text PRIMARY KEY NOT NULL,
	`compressions` integer NOT NULL,
	`data` blob NOT NULL,
	`batch_id` integer,
	FOREIGN KEY (`attempt_id`) REFERENCES `attempts`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`batch_id`) REFERENCES `import_batches`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `equipment_events` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`event_key` text NOT NULL,
	`date` text NOT NULL,
	`manikin_id` integer NOT NULL,
	`site_id` integer,
	`event` text NOT NULL,
	`quantity` integer DEFAULT 1 NOT NULL,
	`note` text DEFAULT '' NOT NULL,
	`resolved` integer DEFAULT false NOT NULL,
	`batch_id` integer,
	FOREIGN KEY (`manikin_id`) REFERENCES `manikins`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`batch_id`) REFERENCES `import_batches`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `equipment_events_key_idx` ON `equipment_events` (`event_key`);--> statement-breakpoint
CREATE INDEX `equipment_manikin_idx` ON `equipment_events` (`manikin_id`,`date`);--> statement-breakpoint
CREATE TABLE `import_batches` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`kind` text NOT NULL,
	`file_name` text NOT NULL,
	`sha256` text NOT NULL,
	`user_id` integer,
	`source` text NOT NULL,
	`status` text DEFAULT 'applied' NOT NULL,
	`rows_read` integer DEFAULT 0 NOT NULL,
	`inserted` integer DEFAULT 0 NOT NULL,
	`updated` integer DEFAULT 0 NOT NULL,
	`unchanged` integer DEFAULT 0 NOT NULL,
	`rejected` integer DEFAULT 0 NOT NULL,
	`new_codes` text,
	`warnings` text,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	`undone_at` text,
	`undone_by` integer,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`undone_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `import_presets` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`name` text NOT NULL,
	`kind` text NOT NULL,
	`mapping` text NOT NULL,
	`created_by` integer,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `import_presets_name_unique` ON `import_presets` (`name`);--> statement-breakpoint
CREATE TABLE `instructors` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`code` text NOT NULL,
	`name` text NOT NULL,
	`site_id` integer,
	`active` integer DEFAULT true NOT NULL,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `instructors_code_unique` ON `instructors` (`code`);--> statement-breakpoint
CREATE INDEX `instructors_site_idx` ON `instructors` (`site_id`);--> statement-breakpoint
CREATE TABLE `mailbox` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`received_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	`mail_from` text NOT NULL,
	`recipients` text NOT NULL,
	`subject` text NOT NULL,
	`text` text NOT NULL,
	`attachments` text NOT NULL,
	`raw` blob NOT NULL
);
--> statement-breakpoint
CREATE TABLE `manikins` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`asset_id` text NOT NULL,
	`patient_type` text,
	`site_id` integer,
	`in_service_since` text,
	`retired_on` text,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `manikins_assetId_unique` ON `manikins` (`asset_id`);--> statement-breakpoint
CREATE INDEX `manikins_site_idx` ON `manikins` (`site_id`);--> statement-breakpoint
CREATE TABLE `policy_versions` (
	`version` integer PRIMARY KEY NOT NULL,
	`policy` text NOT NULL,
	`note` text DEFAULT '' NOT NULL,
	`created_by` integer,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `quarter_notes` (
	`quarter` text PRIMARY KEY NOT NULL,
	`actions` text NOT NULL,
	`updated_by` integer,
	`updated_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	FOREIGN KEY (`updated_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `rejected_rows` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`batch_id` integer NOT NULL,
	`row_number` integer NOT NULL,
	`column` text,
	`reason` text NOT NULL,
	`raw` text,
	FOREIGN KEY (`batch_id`) REFERENCES `import_batches`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `rejected_rows_batch_idx` ON `rejected_rows` (`batch_id`);--> statement-breakpoint
CREATE TABLE `report_sends` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`report_id` integer NOT NULL,
	`sent_by` integer,
	`recipients` text NOT NULL,
	`status` text NOT NULL,
	`error` text,
	`message_id` text,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	FOREIGN KEY (`report_id`) REFERENCES `reports`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`sent_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `reports` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`period` text NOT NULL,
	`version` integer NOT NULL,
	`data` text NOT NULL,
	`pdf` blob NOT NULL,
	`created_by` integer,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `reports_period_version_idx` ON `reports` (`period`,`version`);--> statement-breakpoint
CREATE TABLE `score_history` (
	`attempt_id` text NOT NULL,
	`policy_version` integer NOT NULL,
	`score` real NOT NULL,
	`passed` integer NOT NULL,
	`error_mask` integer NOT NULL,
	`replaced_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	PRIMARY KEY(`attempt_id`, `policy_version`),
	FOREIGN KEY (`attempt_id`) REFERENCES `attempts`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `sessions` (
	`sid` text PRIMARY KEY NOT NULL,
	`sess` text NOT NULL,
	`expires_at` integer NOT NULL
);
--> statement-breakpoint
CREATE INDEX `sessions_expires_idx` ON `sessions` (`expires_at`);--> statement-breakpoint
CREATE TABLE `settings` (
	`key` text PRIMARY KEY NOT NULL,
	`value` text NOT NULL,
	`updated_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL
);
--> statement-breakpoint
CREATE TABLE `sites` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`code` text NOT NULL,
	`name` text NOT NULL,
	`active` integer DEFAULT true NOT NULL,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `sites_code_unique` ON `sites` (`code`);--> statement-breakpoint
CREATE TABLE `users` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`email` text NOT NULL,
	`display_name` text NOT NULL,
	`password_hash` text NOT NULL,
	`role` text NOT NULL,
	`instructor_id` integer,
	`active` integer DEFAULT true NOT NULL,
	`length_unit` text DEFAULT 'mm' NOT NULL,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	FOREIGN KEY (`instructor_id`) REFERENCES `instructors`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `users_email_unique` ON `users` (`email`);