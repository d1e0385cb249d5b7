CREATE TABLE `lab_methods` (
	`id` text PRIMARY KEY NOT NULL,
	`code` text NOT NULL,
	`version` integer NOT NULL,
	`kind` text NOT NULL,
	`name` text NOT NULL,
	`details` text NOT NULL,
	`qualification_run_id` text,
	`training_interval_months` integer DEFAULT 24 NOT NULL,
	`status` text DEFAULT 'draft' NOT NULL,
	`created_by` text NOT NULL,
	`created_at` text NOT NULL,
	`approved_by` text,
	`approved_at` text,
	`superseded_at` text,
	FOREIGN KEY (`qualification_run_id`) REFERENCES `test_runs`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`approved_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `lab_methods_code_version_uq` ON `lab_methods` (`code`,`version`);--> statement-breakpoint
CREATE INDEX `lab_methods_kind_status_idx` ON `lab_methods` (`kind`,`status`);--> statement-breakpoint
CREATE TABLE `test_run_methods` (
	`run_id` text NOT NULL,
	`kind` text NOT NULL,
	`method_id` text NOT NULL,
	PRIMARY KEY(`run_id`, `kind`),
	FOREIGN KEY (`run_id`) REFERENCES `test_runs`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`method_id`) REFERENCES `lab_methods`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `test_run_methods_method_idx` ON `test_run_methods` (`method_id`);--> statement-breakpoint
CREATE TABLE `training_records` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` text NOT NULL,
	`kind` text NOT NULL,
	`method_code` text,
	`method_id` text,
	`document_id` text,
	`document_version_id` text,
	`trained_on` text NOT NULL,
	`expires_on` text NOT NULL,
	`trainer_id` text,
	`reminded_for` text,
	`created_at` text NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`method_id`) REFERENCES `lab_methods`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`document_id`) REFERENCES `documents`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`document_version_id`) REFERENCES `document_versions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`trainer_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `training_records_user_idx` ON `training_records` (`user_id`,`kind`);--> statement-breakpoint
CREATE INDEX `training_records_method_idx` ON `training_records` (`method_code`,`user_id`);--> statement-breakpoint
CREATE INDEX `training_records_expiry_idx` ON `training_records` (`expires_on`);