CREATE TABLE `instrument_calibrations` (
	`id` text PRIMARY KEY NOT NULL,
	`instrument_id` text NOT NULL,
	`calibrated_on` text NOT NULL,
	`due_on` text NOT NULL,
	`performer` text NOT NULL,
	`performed_by` text NOT NULL,
	`certificate_number` text,
	`certificate_file_id` text,
	`result` text NOT NULL,
	`note` text,
	`nonconformance_id` text,
	`recorded_by` text,
	`created_at` text NOT NULL,
	FOREIGN KEY (`instrument_id`) REFERENCES `instruments`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`certificate_file_id`) REFERENCES `evidence_files`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`recorded_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `instrument_calibrations_instrument_idx` ON `instrument_calibrations` (`instrument_id`,`calibrated_on`);--> statement-breakpoint
CREATE TABLE `instrument_notices` (
	`instrument_id` text NOT NULL,
	`due_on` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`instrument_id`) REFERENCES `instruments`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `instrument_notices_uq` ON `instrument_notices` (`instrument_id`,`due_on`);--> statement-breakpoint
CREATE TABLE `instruments` (
	`id` text PRIMARY KEY NOT NULL,
	`asset_number` text NOT NULL,
	`kind` text NOT NULL,
	`description` text NOT NULL,
	`location` text NOT NULL,
	`range` text,
	`resolution` text,
	`status` text DEFAULT 'in_service' NOT NULL,
	`status_reason` text,
	`calibration_interval_months` integer,
	`expires_on` text,
	`due_on` text,
	`created_by` text,
	`created_at` text NOT NULL,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `instruments_asset_number_unique` ON `instruments` (`asset_number`);--> statement-breakpoint
CREATE INDEX `instruments_status_due_idx` ON `instruments` (`status`,`due_on`);--> statement-breakpoint
CREATE INDEX `instruments_kind_idx` ON `instruments` (`kind`);--> statement-breakpoint
CREATE TABLE `test_run_instruments` (
	`run_id` text NOT NULL,
	`instrument_id` text NOT NULL,
	PRIMARY KEY(`run_id`, `instrument_id`),
	FOREIGN KEY (`run_id`) REFERENCES `test_runs`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`instrument_id`) REFERENCES `instruments`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `test_run_instruments_instrument_idx` ON `test_run_instruments` (`instrument_id`);