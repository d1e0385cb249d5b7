CREATE TABLE `wash_cycle_lots` (
	`lot_number` text NOT NULL,
	`cycle_id` text NOT NULL,
	PRIMARY KEY(`lot_number`, `cycle_id`),
	FOREIGN KEY (`cycle_id`) REFERENCES `wash_cycles`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `wash_cycle_lots_cycle_idx` ON `wash_cycle_lots` (`cycle_id`);--> statement-breakpoint
CREATE TABLE `wash_cycles` (
	`id` text PRIMARY KEY NOT NULL,
	`system_id` text NOT NULL,
	`cycle_number` text NOT NULL,
	`recipe_version_id` text NOT NULL,
	`part_family_id` text NOT NULL,
	`baskets` integer NOT NULL,
	`started_at` text NOT NULL,
	`ended_at` text NOT NULL,
	`operator` text NOT NULL,
	`actual_values` text NOT NULL,
	`flagged` integer DEFAULT false NOT NULL,
	`flag_reasons` text NOT NULL,
	`source` text NOT NULL,
	`batch_id` text NOT NULL,
	`recorded_by` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`system_id`) REFERENCES `cleaning_systems`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`recipe_version_id`) REFERENCES `recipe_versions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`part_family_id`) REFERENCES `part_families`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`recorded_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `wash_cycles_system_number_uq` ON `wash_cycles` (`system_id`,`cycle_number`);--> statement-breakpoint
CREATE INDEX `wash_cycles_version_started_idx` ON `wash_cycles` (`recipe_version_id`,`started_at`);--> statement-breakpoint
CREATE INDEX `wash_cycles_started_idx` ON `wash_cycles` (`started_at`);--> statement-breakpoint
CREATE INDEX `wash_cycles_batch_idx` ON `wash_cycles` (`batch_id`);--> statement-breakpoint
ALTER TABLE `change_request_tests` ADD `min_cycles` integer;--> statement-breakpoint
ALTER TABLE `requalification_matrix_rows` ADD `min_cycles` integer DEFAULT 3 NOT NULL;--> statement-breakpoint
ALTER TABLE `test_samples` ADD `cycle_number` text;--> statement-breakpoint
CREATE INDEX `test_samples_cycle_idx` ON `test_samples` (`cycle_number`);