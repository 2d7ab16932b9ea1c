CREATE TABLE `alert_deliveries` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`user_id` integer NOT NULL,
	`key` text NOT NULL,
	`kind` text NOT NULL,
	`summary` text NOT NULL,
	`link_path` text,
	`link_label` text,
	`sent_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `alert_deliveries_user_key_idx` ON `alert_deliveries` (`user_id`,`key`);--> statement-breakpoint
CREATE INDEX `alert_deliveries_sent_idx` ON `alert_deliveries` (`sent_at`);--> statement-breakpoint
ALTER TABLE `users` ADD `alert_kinds` text;--> statement-breakpoint
-- signals mailed before deliveries were kept per person went to every active coordinator and quality lead
INSERT INTO `alert_deliveries` (`user_id`, `key`, `kind`, `summary`, `sent_at`) SELECT `users`.`id`, `alert_log`.`key`, substr(`alert_log`.`key`, 1, instr(`alert_log`.`key`, ':') - 1), 'Mailed before alerts were chosen per person (' || `alert_log`.`key` || ')', `alert_log`.`sent_at` FROM `alert_log` JOIN `users` ON `users`.`active` = 1 AND `users`.`role` IN ('coordinator', 'quality_lead');--> statement-breakpoint
DROP TABLE `alert_log`;
