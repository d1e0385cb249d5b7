CREATE TABLE `company_settings` (
	`id` text PRIMARY KEY NOT NULL,
	`company_name` text NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text
);
--> statement-breakpoint
CREATE TABLE `qualified_combinations` (
	`id` text PRIMARY KEY NOT NULL,
	`recipe_version_id` text NOT NULL,
	`part_family_id` text NOT NULL,
	`status` text DEFAULT 'qualified' NOT NULL,
	`basis` text NOT NULL,
	`qualified_on` text NOT NULL,
	`created_by` text,
	`created_at` text NOT NULL,
	`withdrawn_at` text,
	FOREIGN KEY (`recipe_version_id`) REFERENCES `recipe_versions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`part_family_id`) REFERENCES `part_families`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `qualified_combinations_uq` ON `qualified_combinations` (`recipe_version_id`,`part_family_id`);--> statement-breakpoint
CREATE INDEX `qualified_combinations_family_idx` ON `qualified_combinations` (`part_family_id`);--> statement-breakpoint
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
ALTER TABLE `part_families` ADD `part_numbers` text DEFAULT '[]' NOT NULL;--> statement-breakpoint
ALTER TABLE `part_families` ADD `wetted_area_method` text;--> statement-breakpoint
ALTER TABLE `part_families` ADD `wetted_area_note` text;--> statement-breakpoint
ALTER TABLE `part_families` ADD `drawing_number` text;--> statement-breakpoint
ALTER TABLE `part_families` ADD `drawing_revision` text;--> statement-breakpoint
ALTER TABLE `part_families` ADD `customer` text;--> statement-breakpoint
ALTER TABLE `part_families` ADD `updated_at` text;--> statement-breakpoint
ALTER TABLE `test_runs` ADD `spec_id` text REFERENCES cleanliness_specs(id);