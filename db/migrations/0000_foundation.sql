CREATE TABLE `audit_events` (
	`seq` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`at` text NOT NULL,
	`actor_id` text,
	`actor_name` text NOT NULL,
	`action` text NOT NULL,
	`record_type` text NOT NULL,
	`record_id` text NOT NULL,
	`old_value` text,
	`new_value` text,
	`reason` text,
	`prev_hash` text NOT NULL,
	`hash` text NOT NULL
);
--> statement-breakpoint
CREATE INDEX `audit_record_idx` ON `audit_events` (`record_type`,`record_id`);--> statement-breakpoint
CREATE INDEX `audit_actor_idx` ON `audit_events` (`actor_id`);--> statement-breakpoint
CREATE INDEX `audit_at_idx` ON `audit_events` (`at`);--> statement-breakpoint
CREATE TABLE `change_requests` (
	`id` text PRIMARY KEY NOT NULL,
	`number` text NOT NULL,
	`title` text NOT NULL,
	`recipe_id` text NOT NULL,
	`from_version_id` text,
	`to_version_id` text,
	`status` text DEFAULT 'draft' NOT NULL,
	`impact` text,
	`impact_details` text,
	`narrative_document_id` text,
	`created_by` text NOT NULL,
	`created_at` text NOT NULL,
	`closed_at` text,
	FOREIGN KEY (`recipe_id`) REFERENCES `recipes`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`from_version_id`) REFERENCES `recipe_versions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`to_version_id`) REFERENCES `recipe_versions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`narrative_document_id`) REFERENCES `documents`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `change_requests_number_unique` ON `change_requests` (`number`);--> statement-breakpoint
CREATE INDEX `change_requests_recipe_idx` ON `change_requests` (`recipe_id`);--> statement-breakpoint
CREATE TABLE `cleaning_systems` (
	`id` text PRIMARY KEY NOT NULL,
	`site_id` text NOT NULL,
	`code` text NOT NULL,
	`name` text NOT NULL,
	`kind` text NOT NULL,
	`description` text,
	`active` integer DEFAULT true NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `cleaning_systems_code_unique` ON `cleaning_systems` (`code`);--> statement-breakpoint
CREATE TABLE `cleanliness_specs` (
	`id` text PRIMARY KEY NOT NULL,
	`code` text NOT NULL,
	`name` text NOT NULL,
	`ccc` text NOT NULL,
	`max_metallic_um` real,
	`max_non_metallic_um` real,
	`max_fibre_um` real,
	`gravimetric_limit_mg` real,
	`gravimetric_basis` text,
	`min_wetting_tension_mnm` real,
	`visual_criteria` text,
	`dryness_criteria` text,
	`created_at` text NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `cleanliness_specs_code_unique` ON `cleanliness_specs` (`code`);--> statement-breakpoint
CREATE TABLE `document_versions` (
	`id` text PRIMARY KEY NOT NULL,
	`document_id` text NOT NULL,
	`version` integer NOT NULL,
	`status` text DEFAULT 'draft' NOT NULL,
	`content` text NOT NULL,
	`content_hash` text,
	`lock_version` integer DEFAULT 0 NOT NULL,
	`effective_date` text,
	`created_by` text NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text,
	FOREIGN KEY (`document_id`) REFERENCES `documents`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `document_versions_uq` ON `document_versions` (`document_id`,`version`);--> statement-breakpoint
CREATE TABLE `documents` (
	`id` text PRIMARY KEY NOT NULL,
	`number` text NOT NULL,
	`title` text NOT NULL,
	`type` text NOT NULL,
	`system_id` text,
	`part_family_id` text,
	`recipe_version_id` text,
	`owner_id` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`system_id`) REFERENCES `cleaning_systems`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`part_family_id`) REFERENCES `part_families`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`recipe_version_id`) REFERENCES `recipe_versions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`owner_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `documents_number_unique` ON `documents` (`number`);--> statement-breakpoint
CREATE TABLE `email_outbox` (
	`id` text PRIMARY KEY NOT NULL,
	`to` text NOT NULL,
	`subject` text NOT NULL,
	`text` text NOT NULL,
	`html` text,
	`status` text DEFAULT 'pending' NOT NULL,
	`attempts` integer DEFAULT 0 NOT NULL,
	`next_attempt_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	`last_error` text,
	`created_at` text NOT NULL,
	`sent_at` text
);
--> statement-breakpoint
CREATE INDEX `email_outbox_due_idx` ON `email_outbox` (`status`,`next_attempt_at`);--> statement-breakpoint
CREATE TABLE `evidence_files` (
	`id` text PRIMARY KEY NOT NULL,
	`run_id` text,
	`sha256` text NOT NULL,
	`original_name` text NOT NULL,
	`mime_type` text NOT NULL,
	`size_bytes` integer NOT NULL,
	`uploaded_by` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`run_id`) REFERENCES `test_runs`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`uploaded_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `evidence_files_run_idx` ON `evidence_files` (`run_id`);--> statement-breakpoint
CREATE INDEX `evidence_files_sha_idx` ON `evidence_files` (`sha256`);--> statement-breakpoint
CREATE TABLE `part_families` (
	`id` text PRIMARY KEY NOT NULL,
	`code` text NOT NULL,
	`name` text NOT NULL,
	`material` text NOT NULL,
	`wetted_area_cm2` real NOT NULL,
	`wetted_volume_cm3` real,
	`spec_id` text NOT NULL,
	`description` text,
	`created_at` text NOT NULL,
	FOREIGN KEY (`spec_id`) REFERENCES `cleanliness_specs`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `part_families_code_unique` ON `part_families` (`code`);--> statement-breakpoint
CREATE TABLE `recipe_parameters` (
	`id` text PRIMARY KEY NOT NULL,
	`version_id` text NOT NULL,
	`stage_id` text NOT NULL,
	`key` text NOT NULL,
	`name` text NOT NULL,
	`kind` text NOT NULL,
	`setpoint` real NOT NULL,
	`unit` text NOT NULL,
	`validated_low` real,
	`validated_high` real,
	`critical` integer DEFAULT false NOT NULL,
	FOREIGN KEY (`version_id`) REFERENCES `recipe_versions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`stage_id`) REFERENCES `recipe_stages`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `recipe_parameters_key_uq` ON `recipe_parameters` (`version_id`,`key`);--> statement-breakpoint
CREATE INDEX `recipe_parameters_key_idx` ON `recipe_parameters` (`key`);--> statement-breakpoint
CREATE TABLE `recipe_stages` (
	`id` text PRIMARY KEY NOT NULL,
	`version_id` text NOT NULL,
	`position` integer NOT NULL,
	`name` text NOT NULL,
	`kind` text NOT NULL,
	`mode` text,
	FOREIGN KEY (`version_id`) REFERENCES `recipe_versions`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `recipe_stages_position_uq` ON `recipe_stages` (`version_id`,`position`);--> statement-breakpoint
CREATE TABLE `recipe_versions` (
	`id` text PRIMARY KEY NOT NULL,
	`recipe_id` text NOT NULL,
	`version` integer NOT NULL,
	`status` text DEFAULT 'draft' NOT NULL,
	`detergent` text,
	`notes` text,
	`effective_from` text,
	`effective_to` text,
	`created_by` text,
	`created_at` text NOT NULL,
	FOREIGN KEY (`recipe_id`) REFERENCES `recipes`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `recipe_versions_uq` ON `recipe_versions` (`recipe_id`,`version`);--> statement-breakpoint
CREATE TABLE `recipes` (
	`id` text PRIMARY KEY NOT NULL,
	`system_id` text NOT NULL,
	`code` text NOT NULL,
	`name` text NOT NULL,
	`description` text,
	`created_at` text NOT NULL,
	FOREIGN KEY (`system_id`) REFERENCES `cleaning_systems`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `recipes_code_unique` ON `recipes` (`code`);--> statement-breakpoint
CREATE TABLE `sessions` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` text NOT NULL,
	`expires_at` integer NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `sessions_user_idx` ON `sessions` (`user_id`);--> statement-breakpoint
CREATE TABLE `signatures` (
	`id` text PRIMARY KEY NOT NULL,
	`record_type` text NOT NULL,
	`record_id` text NOT NULL,
	`user_id` text NOT NULL,
	`printed_name` text NOT NULL,
	`meaning` text NOT NULL,
	`signed_at` text NOT NULL,
	`content_hash` text NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `signatures_record_idx` ON `signatures` (`record_type`,`record_id`);--> statement-breakpoint
CREATE UNIQUE INDEX `signatures_once_uq` ON `signatures` (`record_type`,`record_id`,`user_id`,`meaning`);--> statement-breakpoint
CREATE TABLE `sites` (
	`id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`location` text,
	`created_at` text NOT NULL
);
--> statement-breakpoint
CREATE TABLE `system_stages` (
	`id` text PRIMARY KEY NOT NULL,
	`system_id` text NOT NULL,
	`position` integer NOT NULL,
	`name` text NOT NULL,
	`kind` text NOT NULL,
	`capabilities` text NOT NULL,
	`tank_volume_l` real,
	FOREIGN KEY (`system_id`) REFERENCES `cleaning_systems`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `system_stages_position_uq` ON `system_stages` (`system_id`,`position`);--> statement-breakpoint
CREATE TABLE `test_results` (
	`id` text PRIMARY KEY NOT NULL,
	`run_id` text NOT NULL,
	`sample_label` text NOT NULL,
	`basket_position` text,
	`worst_case` integer DEFAULT false NOT NULL,
	`data` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`run_id`) REFERENCES `test_runs`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `test_results_run_idx` ON `test_results` (`run_id`);--> statement-breakpoint
CREATE TABLE `test_runs` (
	`id` text PRIMARY KEY NOT NULL,
	`number` text NOT NULL,
	`part_family_id` text NOT NULL,
	`recipe_version_id` text NOT NULL,
	`change_request_id` text,
	`protocol_document_id` text,
	`test_type` text NOT NULL,
	`status` text DEFAULT 'open' NOT NULL,
	`outcome` text,
	`revision` integer DEFAULT 1 NOT NULL,
	`supersedes_id` text,
	`technician_id` text,
	`lab` text,
	`performed_on` text,
	`created_by` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`part_family_id`) REFERENCES `part_families`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`recipe_version_id`) REFERENCES `recipe_versions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`change_request_id`) REFERENCES `change_requests`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`protocol_document_id`) REFERENCES `documents`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`technician_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `test_runs_number_unique` ON `test_runs` (`number`);--> statement-breakpoint
CREATE INDEX `test_runs_family_idx` ON `test_runs` (`part_family_id`);--> statement-breakpoint
CREATE INDEX `test_runs_recipe_version_idx` ON `test_runs` (`recipe_version_id`);--> statement-breakpoint
CREATE INDEX `test_runs_change_idx` ON `test_runs` (`change_request_id`);--> statement-breakpoint
CREATE TABLE `user_roles` (
	`user_id` text NOT NULL,
	`role` text NOT NULL,
	PRIMARY KEY(`user_id`, `role`),
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `users` (
	`id` text PRIMARY KEY NOT NULL,
	`email` text NOT NULL,
	`name` text NOT NULL,
	`job_title` text,
	`password_hash` text NOT NULL,
	`active` integer DEFAULT true NOT NULL,
	`failed_attempts` integer DEFAULT 0 NOT NULL,
	`locked_until` text,
	`must_change_password` integer DEFAULT false NOT NULL,
	`password_changed_at` text,
	`created_at` text NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `users_email_unique` ON `users` (`email`);