CREATE TABLE `import_jobs` (
	`id` text PRIMARY KEY NOT NULL,
	`upload_id` text NOT NULL,
	`user_id` integer NOT NULL,
	`mode` text NOT NULL,
	`status` text NOT NULL,
	`total_bytes` integer,
	`rows_read` integer NOT NULL,
	`summary` text,
	`error` text,
	`rejected_path` text NOT NULL,
	`rejected_kept` integer NOT NULL,
	`created_at` text NOT NULL,
	`finished_at` text
);
--> statement-breakpoint
CREATE INDEX `import_jobs_status_idx` ON `import_jobs` (`status`);--> statement-breakpoint
CREATE TABLE `import_uploads` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` integer NOT NULL,
	`kind` text NOT NULL,
	`file_name` text NOT NULL,
	`size_bytes` integer NOT NULL,
	`path` text NOT NULL,
	`uploaded_at` text NOT NULL,
	`ended_at` text,
	`end_reason` text
);
