CREATE TABLE `deviation_lots` (
	`id` text PRIMARY KEY NOT NULL,
	`deviation_id` text NOT NULL,
	`lot` text NOT NULL,
	`recorded_by` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`deviation_id`) REFERENCES `deviations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`recorded_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `deviation_lots_uq` ON `deviation_lots` (`deviation_id`,`lot`);--> statement-breakpoint
CREATE TABLE `deviation_parameters` (
	`id` text PRIMARY KEY NOT NULL,
	`deviation_id` text NOT NULL,
	`key` text NOT NULL,
	`name` text NOT NULL,
	`unit` text NOT NULL,
	`validated_low` real,
	`validated_high` real,
	`temporary_low` real,
	`temporary_high` real,
	FOREIGN KEY (`deviation_id`) REFERENCES `deviations`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `deviation_parameters_uq` ON `deviation_parameters` (`deviation_id`,`key`);--> statement-breakpoint
CREATE INDEX `deviation_parameters_key_idx` ON `deviation_parameters` (`key`);--> statement-breakpoint
CREATE TABLE `deviation_part_families` (
	`deviation_id` text NOT NULL,
	`part_family_id` text NOT NULL,
	FOREIGN KEY (`deviation_id`) REFERENCES `deviations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`part_family_id`) REFERENCES `part_families`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `deviation_part_families_uq` ON `deviation_part_families` (`deviation_id`,`part_family_id`);--> statement-breakpoint
CREATE TABLE `deviations` (
	`id` text PRIMARY KEY NOT NULL,
	`number` text NOT NULL,
	`recipe_id` text NOT NULL,
	`title` text NOT NULL,
	`justification` text NOT NULL,
	`risk_level` text NOT NULL,
	`risk` text NOT NULL,
	`ends_on` text,
	`max_lots` integer,
	`reminder_days` integer DEFAULT 3 NOT NULL,
	`status` text DEFAULT 'draft' NOT NULL,
	`approved_at` text,
	`ended_at` text,
	`reminded_for_end` text,
	`created_by` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`recipe_id`) REFERENCES `recipes`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `deviations_number_unique` ON `deviations` (`number`);--> statement-breakpoint
CREATE INDEX `deviations_recipe_idx` ON `deviations` (`recipe_id`);--> statement-breakpoint
CREATE INDEX `deviations_status_idx` ON `deviations` (`status`);