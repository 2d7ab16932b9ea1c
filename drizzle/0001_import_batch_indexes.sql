CREATE INDEX `classes_batch_idx` ON `classes` (`batch_id`);--> statement-breakpoint
CREATE INDEX `compression_streams_batch_idx` ON `compression_streams` (`batch_id`);--> statement-breakpoint
CREATE INDEX `equipment_batch_idx` ON `equipment_events` (`batch_id`);--> statement-breakpoint
CREATE INDEX `import_batches_user_idx` ON `import_batches` (`user_id`,`id`);