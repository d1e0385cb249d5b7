CREATE TABLE `company_settings` (
	`id` text PRIMARY KEY NOT NULL,
	`company_name` text NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text
);
--> statement-breakpoint
DROP INDEX `cleanliness_specs_code_unique`;--> statement-breakpoint
ALTER TABLE `cleanliness_specs` ADD `customer` text;--> statement-breakpoint
ALTER TABLE `cleanliness_specs` ADD `document_number` text;--> statement-breakpoint
ALTER TABLE `cleanliness_specs` ADD `revision` text DEFAULT '1' NOT NULL;--> statement-breakpoint
ALTER TABLE `cleanliness_specs` ADD `status` text DEFAULT 'in_force' NOT NULL;--> statement-breakpoint
ALTER TABLE `cleanliness_specs` ADD `supersedes_id` text;--> statement-breakpoint
ALTER TABLE `cleanliness_specs` ADD `superseded_at` text;--> statement-breakpoint
ALTER TABLE `cleanliness_specs` ADD `source_file_id` text;--> statement-breakpoint
ALTER TABLE `cleanliness_specs` ADD `extra_requirements` text;--> statement-breakpoint
ALTER TABLE `cleanliness_specs` ADD `customer_approves_changes` integer DEFAULT false NOT NULL;--> statement-breakpoint
CREATE UNIQUE INDEX `cleanliness_specs_code_revision_uq` ON `cleanliness_specs` (`code`,`revision`);--> statement-breakpoint
CREATE INDEX `cleanliness_specs_status_idx` ON `cleanliness_specs` (`status`);--> statement-breakpoint
ALTER TABLE `cleaning_systems` ADD `asset_number` text;--> statement-breakpoint
ALTER TABLE `cleaning_systems` ADD `retired_at` text;--> statement-breakpoint
ALTER TABLE `cleaning_systems` ADD `retire_reason` text;--> statement-breakpoint
CREATE UNIQUE INDEX `cleaning_systems_asset_number_unique` ON `cleaning_systems` (`asset_number`);--> statement-breakpoint
ALTER TABLE `system_stages` ADD `filter_rating_um` real;--> statement-breakpoint
ALTER TABLE `system_stages` ADD `ultrasonic_power_w` real;--> statement-breakpoint
ALTER TABLE `system_stages` ADD `ultrasonic_frequency_khz` real;--> statement-breakpoint
ALTER TABLE `system_stages` ADD `spray_pressure_bar` real;--> statement-breakpoint
ALTER TABLE `system_stages` ADD `injection_pressure_bar` real;--> statement-breakpoint
ALTER TABLE `system_stages` ADD `nozzle_set` text;--> statement-breakpoint
ALTER TABLE `part_families` ADD `part_numbers` text DEFAULT '[]' NOT NULL;--> statement-breakpoint
ALTER TABLE `part_families` ADD `wetted_area_method` text;--> statement-breakpoint
ALTER TABLE `part_families` ADD `wetted_area_note` text;--> statement-breakpoint
ALTER TABLE `part_families` ADD `drawing_number` text;--> statement-breakpoint
ALTER TABLE `part_families` ADD `drawing_revision` text;--> statement-breakpoint
ALTER TABLE `part_families` ADD `customer` text;--> statement-breakpoint
ALTER TABLE `part_families` ADD `updated_at` text;--> statement-breakpoint
ALTER TABLE `requalification_intervals` ADD `basis` text;--> statement-breakpoint
ALTER TABLE `requalification_intervals` ADD `qualified_by` text REFERENCES users(id);--> statement-breakpoint
ALTER TABLE `test_runs` ADD `spec_id` text REFERENCES cleanliness_specs(id);