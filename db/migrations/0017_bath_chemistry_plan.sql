CREATE TABLE `bath_limits` (
	`id` text PRIMARY KEY NOT NULL,
	`stage_id` text NOT NULL,
	`variable` text NOT NULL,
	`recipe_version_id` text NOT NULL,
	`detergent_id` text,
	`target` real,
	`action_low` real,
	`action_high` real,
	`reject_low` real,
	`reject_high` real,
	`created_by` text NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text,
	FOREIGN KEY (`stage_id`) REFERENCES `system_stages`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`recipe_version_id`) REFERENCES `recipe_versions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`detergent_id`) REFERENCES `detergents`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `bath_limits_uq` ON `bath_limits` (`stage_id`,`variable`);--> statement-breakpoint
CREATE TABLE `detergents` (
	`id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`supplier` text,
	`titration_method` text,
	`factor_pct_per_ml` real NOT NULL,
	`created_by` text NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `detergents_name_unique` ON `detergents` (`name`);--> statement-breakpoint
ALTER TABLE `bath_records` ADD `ph` real;--> statement-breakpoint
ALTER TABLE `bath_records` ADD `oil_content_g_per_l` real;--> statement-breakpoint
ALTER TABLE `bath_records` ADD `titrant_volume_ml` real;--> statement-breakpoint
ALTER TABLE `bath_records` ADD `detergent_id` text REFERENCES detergents(id);--> statement-breakpoint
ALTER TABLE `bath_records` ADD `titration_factor` real;--> statement-breakpoint
ALTER TABLE `bath_records` ADD `addition_quantity` real;--> statement-breakpoint
ALTER TABLE `bath_records` ADD `addition_unit` text;--> statement-breakpoint
ALTER TABLE `bath_records` ADD `addition_lot` text;--> statement-breakpoint
ALTER TABLE `bath_records` ADD `filter_rating_um` real;--> statement-breakpoint
ALTER TABLE `bath_records` ADD `differential_pressure_bar` real;--> statement-breakpoint
ALTER TABLE `bath_records` ADD `check_result` text;--> statement-breakpoint
ALTER TABLE `bath_records` ADD `photo_file_id` text REFERENCES evidence_files(id);--> statement-breakpoint
ALTER TABLE `bath_records` ADD `limit_state` text;--> statement-breakpoint
ALTER TABLE `bath_records` ADD `limit_findings` text;