CREATE TABLE `bath_records` (
	`id` text PRIMARY KEY NOT NULL,
	`stage_id` text NOT NULL,
	`kind` text NOT NULL,
	`performed_at` text NOT NULL,
	`concentration_pct` real,
	`conductivity_us_per_cm` real,
	`temperature_c` real,
	`count_per_ml_4` real,
	`count_per_ml_6` real,
	`count_per_ml_14` real,
	`filter_description` text,
	`notes` text,
	`recorded_by` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`stage_id`) REFERENCES `system_stages`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`recorded_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `bath_records_stage_idx` ON `bath_records` (`stage_id`,`performed_at`);--> statement-breakpoint
CREATE TABLE `maintenance_intervals` (
	`id` text PRIMARY KEY NOT NULL,
	`stage_id` text NOT NULL,
	`kind` text NOT NULL,
	`interval_days` integer NOT NULL,
	`warn_days` integer DEFAULT 2 NOT NULL,
	`created_by` text NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text,
	FOREIGN KEY (`stage_id`) REFERENCES `system_stages`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `maintenance_intervals_uq` ON `maintenance_intervals` (`stage_id`,`kind`);--> statement-breakpoint
CREATE TABLE `maintenance_notices` (
	`id` text PRIMARY KEY NOT NULL,
	`interval_id` text NOT NULL,
	`due_at` text NOT NULL,
	`level` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`interval_id`) REFERENCES `maintenance_intervals`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `maintenance_notices_uq` ON `maintenance_notices` (`interval_id`,`due_at`,`level`);--> statement-breakpoint
DROP INDEX `test_runs_number_unique`;--> statement-breakpoint
ALTER TABLE `test_runs` ADD `revision_reason` text;--> statement-breakpoint
ALTER TABLE `test_runs` ADD `requirement` text;--> statement-breakpoint
ALTER TABLE `test_runs` ADD `run_data` text;--> statement-breakpoint
CREATE UNIQUE INDEX `test_runs_number_revision_uq` ON `test_runs` (`number`,`revision`);--> statement-breakpoint
ALTER TABLE `evidence_files` ADD `kind` text DEFAULT 'lab_report' NOT NULL;--> statement-breakpoint
ALTER TABLE `evidence_files` ADD `sample_label` text;