CREATE TABLE `action_notes` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`action_id` integer NOT NULL,
	`date` text NOT NULL,
	`text` text NOT NULL,
	`created_by` integer,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	FOREIGN KEY (`action_id`) REFERENCES `improvement_actions`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `action_notes_action_idx` ON `action_notes` (`action_id`,`date`);--> statement-breakpoint
CREATE TABLE `alert_log` (
	`key` text PRIMARY KEY NOT NULL,
	`sent_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL
);
--> statement-breakpoint
CREATE TABLE `improvement_actions` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`title` text NOT NULL,
	`aim` text NOT NULL,
	`target` real NOT NULL,
	`site_id` integer,
	`instructor_id` integer,
	`profile` text,
	`start_date` text NOT NULL,
	`owner` text NOT NULL,
	`status` text DEFAULT 'planned' NOT NULL,
	`created_by` integer,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	`updated_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`instructor_id`) REFERENCES `instructors`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `improvement_actions_start_idx` ON `improvement_actions` (`start_date`);--> statement-breakpoint
ALTER TABLE `report_sends` ADD `delivered` text DEFAULT '[]' NOT NULL;--> statement-breakpoint
ALTER TABLE `report_sends` ADD `cover_note` text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE `reports` ADD `released_at` text;--> statement-breakpoint
ALTER TABLE `reports` ADD `released_by` integer REFERENCES users(id);--> statement-breakpoint
-- versions already e-mailed to funders count as released: the funders hold their PDF
UPDATE `reports` SET `released_at` = (SELECT min(`created_at`) FROM `report_sends` WHERE `report_sends`.`report_id` = `reports`.`id` AND `report_sends`.`status` = 'sent') WHERE EXISTS (SELECT 1 FROM `report_sends` WHERE `report_sends`.`report_id` = `reports`.`id` AND `report_sends`.`status` = 'sent');
