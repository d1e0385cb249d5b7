CREATE TABLE `nonconformance_actions` (
	`id` text PRIMARY KEY NOT NULL,
	`nonconformance_id` text NOT NULL,
	`kind` text NOT NULL,
	`description` text NOT NULL,
	`owner_id` text NOT NULL,
	`due_on` text NOT NULL,
	`status` text DEFAULT 'open' NOT NULL,
	`evidence_link` text,
	`change_request_id` text,
	`created_by` text NOT NULL,
	`created_at` text NOT NULL,
	`done_at` text,
	FOREIGN KEY (`nonconformance_id`) REFERENCES `nonconformances`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`owner_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`change_request_id`) REFERENCES `change_requests`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `nonconformance_actions_nc_idx` ON `nonconformance_actions` (`nonconformance_id`);--> statement-breakpoint
CREATE INDEX `nonconformance_actions_owner_idx` ON `nonconformance_actions` (`owner_id`,`status`);--> statement-breakpoint
CREATE INDEX `nonconformance_actions_change_idx` ON `nonconformance_actions` (`change_request_id`);--> statement-breakpoint
CREATE TABLE `nonconformance_files` (
	`id` text PRIMARY KEY NOT NULL,
	`nonconformance_id` text NOT NULL,
	`file_id` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`nonconformance_id`) REFERENCES `nonconformances`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`file_id`) REFERENCES `evidence_files`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `nonconformance_files_uq` ON `nonconformance_files` (`nonconformance_id`,`file_id`);--> statement-breakpoint
CREATE TABLE `nonconformance_items` (
	`id` text PRIMARY KEY NOT NULL,
	`nonconformance_id` text NOT NULL,
	`item_kind` text NOT NULL,
	`item_id` text NOT NULL,
	`label` text NOT NULL,
	`lots` text NOT NULL,
	`processed_at` text NOT NULL,
	`hold` text DEFAULT 'pending' NOT NULL,
	`hold_by` text,
	`hold_at` text,
	`disposition` text,
	`reclean_recipe_id` text,
	`concession_reference` text,
	`concession_file_id` text,
	`disposition_note` text,
	`disposition_by` text,
	`disposition_at` text,
	FOREIGN KEY (`nonconformance_id`) REFERENCES `nonconformances`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`hold_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`reclean_recipe_id`) REFERENCES `recipes`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`concession_file_id`) REFERENCES `evidence_files`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`disposition_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `nonconformance_items_uq` ON `nonconformance_items` (`nonconformance_id`,`item_kind`,`item_id`);--> statement-breakpoint
CREATE TABLE `nonconformance_notices` (
	`id` text PRIMARY KEY NOT NULL,
	`subject` text NOT NULL,
	`due_on` text NOT NULL,
	`level` text NOT NULL,
	`created_at` text NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `nonconformance_notices_uq` ON `nonconformance_notices` (`subject`,`due_on`,`level`);--> statement-breakpoint
CREATE TABLE `nonconformances` (
	`id` text PRIMARY KEY NOT NULL,
	`number` text NOT NULL,
	`year` integer NOT NULL,
	`sequence` integer NOT NULL,
	`title` text NOT NULL,
	`description` text NOT NULL,
	`severity` text NOT NULL,
	`source_kind` text NOT NULL,
	`source_id` text,
	`source_label` text NOT NULL,
	`manual_kind` text,
	`detected_on` text NOT NULL,
	`recipe_id` text,
	`part_family_id` text,
	`status` text DEFAULT 'open' NOT NULL,
	`owner_id` text,
	`due_on` text,
	`cause_method` text,
	`root_cause` text,
	`effectiveness_criterion` text,
	`effectiveness_due_on` text,
	`effectiveness_result` text,
	`effectiveness_note` text,
	`effectiveness_run_id` text,
	`effectiveness_file_id` text,
	`effectiveness_checked_by` text,
	`effectiveness_checked_at` text,
	`cancel_reason` text,
	`opened_by` text,
	`created_at` text NOT NULL,
	`closed_at` text,
	FOREIGN KEY (`recipe_id`) REFERENCES `recipes`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`part_family_id`) REFERENCES `part_families`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`owner_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`effectiveness_run_id`) REFERENCES `test_runs`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`effectiveness_file_id`) REFERENCES `evidence_files`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`effectiveness_checked_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`opened_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `nonconformances_number_unique` ON `nonconformances` (`number`);--> statement-breakpoint
CREATE UNIQUE INDEX `nonconformances_year_sequence_uq` ON `nonconformances` (`year`,`sequence`);--> statement-breakpoint
CREATE INDEX `nonconformances_status_idx` ON `nonconformances` (`status`);--> statement-breakpoint
CREATE INDEX `nonconformances_recipe_idx` ON `nonconformances` (`recipe_id`);--> statement-breakpoint
CREATE INDEX `nonconformances_family_idx` ON `nonconformances` (`part_family_id`);--> statement-breakpoint
CREATE INDEX `nonconformances_source_idx` ON `nonconformances` (`source_kind`,`source_id`);--> statement-breakpoint
CREATE INDEX `nonconformances_owner_idx` ON `nonconformances` (`owner_id`);