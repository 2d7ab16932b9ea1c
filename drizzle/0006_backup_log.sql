CREATE TABLE `backup_log` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`taken_at` text NOT NULL,
	`file` text NOT NULL,
	`size_bytes` integer NOT NULL,
	`source` text NOT NULL,
	`verified` integer NOT NULL,
	`message` text NOT NULL
);
--> statement-breakpoint
CREATE INDEX `backup_log_taken_idx` ON `backup_log` (`taken_at`);