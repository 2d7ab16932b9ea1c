CREATE TABLE `alert_log` (
	`key` text PRIMARY KEY NOT NULL,
	`sent_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL
);
