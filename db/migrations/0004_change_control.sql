CREATE TABLE `change_request_assessments` (
	`change_request_id` text PRIMARY KEY NOT NULL,
	`kind` text NOT NULL,
	`part_family_id` text,
	`computed_impact` text,
	`raised_to` text,
	`raise_reason` text,
	`revision` integer DEFAULT 1 NOT NULL,
	`matrix_id` text,
	`content_hash` text,
	`updated_at` text,
	FOREIGN KEY (`change_request_id`) REFERENCES `change_requests`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`part_family_id`) REFERENCES `part_families`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`matrix_id`) REFERENCES `requalification_matrices`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `change_request_evidence` (
	`id` text PRIMARY KEY NOT NULL,
	`requirement_id` text NOT NULL,
	`test_run_id` text NOT NULL,
	`linked_by` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`requirement_id`) REFERENCES `change_request_tests`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`test_run_id`) REFERENCES `test_runs`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`linked_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `change_request_evidence_uq` ON `change_request_evidence` (`requirement_id`,`test_run_id`);--> statement-breakpoint
CREATE TABLE `change_request_tests` (
	`id` text PRIMARY KEY NOT NULL,
	`change_request_id` text NOT NULL,
	`test_type` text NOT NULL,
	`samples` integer NOT NULL,
	`confidence_pct` real NOT NULL,
	`reliability_pct` real NOT NULL,
	`because` text NOT NULL,
	FOREIGN KEY (`change_request_id`) REFERENCES `change_requests`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `change_request_tests_uq` ON `change_request_tests` (`change_request_id`,`test_type`);--> statement-breakpoint
CREATE TABLE `requalification_intervals` (
	`id` text PRIMARY KEY NOT NULL,
	`recipe_version_id` text NOT NULL,
	`part_family_id` text NOT NULL,
	`interval_months` integer DEFAULT 12 NOT NULL,
	`last_qualified_at` text NOT NULL,
	`notified_for_due` text,
	`created_at` text NOT NULL,
	FOREIGN KEY (`recipe_version_id`) REFERENCES `recipe_versions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`part_family_id`) REFERENCES `part_families`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `requalification_intervals_uq` ON `requalification_intervals` (`recipe_version_id`,`part_family_id`);--> statement-breakpoint
CREATE TABLE `requalification_matrices` (
	`id` text PRIMARY KEY NOT NULL,
	`version` integer NOT NULL,
	`status` text NOT NULL,
	`note` text,
	`created_by` text,
	`created_at` text NOT NULL,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `requalification_matrices_version_unique` ON `requalification_matrices` (`version`);--> statement-breakpoint
CREATE TABLE `requalification_matrix_rows` (
	`id` text PRIMARY KEY NOT NULL,
	`matrix_id` text NOT NULL,
	`subject` text NOT NULL,
	`test_type` text NOT NULL,
	`confidence_pct` real NOT NULL,
	`reliability_pct` real NOT NULL,
	FOREIGN KEY (`matrix_id`) REFERENCES `requalification_matrices`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `requalification_matrix_rows_uq` ON `requalification_matrix_rows` (`matrix_id`,`subject`,`test_type`);