ALTER TABLE `report_sends` ADD `delivered` text DEFAULT '[]' NOT NULL;--> statement-breakpoint
ALTER TABLE `report_sends` ADD `cover_note` text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE `reports` ADD `released_at` text;--> statement-breakpoint
ALTER TABLE `reports` ADD `released_by` integer REFERENCES users(id);--> statement-breakpoint
-- versions already e-mailed to funders count as released: the funders hold their PDF
UPDATE `reports` SET `released_at` = (SELECT min(`created_at`) FROM `report_sends` WHERE `report_sends`.`report_id` = `reports`.`id` AND `report_sends`.`status` = 'sent') WHERE EXISTS (SELECT 1 FROM `report_sends` WHERE `report_sends`.`report_id` = `reports`.`id` AND `report_sends`.`status` = 'sent');
