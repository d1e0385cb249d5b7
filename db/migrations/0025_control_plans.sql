CREATE TABLE `control_plan_lines` (
	`id` text PRIMARY KEY NOT NULL,
	`version_id` text NOT NULL,
	`position` integer NOT NULL,
	`characteristic` text NOT NULL,
	`method` text NOT NULL,
	`stage_id` text,
	`sample_size` integer NOT NULL,
	`min_cycles` integer,
	`frequency` text NOT NULL,
	`every_n` integer,
	`reaction_plan` text NOT NULL,
	FOREIGN KEY (`version_id`) REFERENCES `control_plan_versions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`stage_id`) REFERENCES `system_stages`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `control_plan_lines_position_uq` ON `control_plan_lines` (`version_id`,`position`);--> statement-breakpoint
CREATE TABLE `control_plan_overdue_notices` (
	`line_id` text NOT NULL,
	`due_at` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`line_id`) REFERENCES `control_plan_lines`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `control_plan_overdue_notices_uq` ON `control_plan_overdue_notices` (`line_id`,`due_at`);--> statement-breakpoint
CREATE TABLE `control_plan_versions` (
	`id` text PRIMARY KEY NOT NULL,
	`plan_id` text NOT NULL,
	`version` integer NOT NULL,
	`status` text DEFAULT 'draft' NOT NULL,
	`note` text NOT NULL,
	`created_by` text NOT NULL,
	`created_at` text NOT NULL,
	`effective_at` text,
	`superseded_at` text,
	FOREIGN KEY (`plan_id`) REFERENCES `control_plans`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `control_plan_versions_uq` ON `control_plan_versions` (`plan_id`,`version`);--> statement-breakpoint
CREATE INDEX `control_plan_versions_status_idx` ON `control_plan_versions` (`status`);--> statement-breakpoint
CREATE TABLE `control_plans` (
	`id` text PRIMARY KEY NOT NULL,
	`recipe_version_id` text NOT NULL,
	`part_family_id` text NOT NULL,
	`created_by` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`recipe_version_id`) REFERENCES `recipe_versions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`part_family_id`) REFERENCES `part_families`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `control_plans_combination_uq` ON `control_plans` (`recipe_version_id`,`part_family_id`);--> statement-breakpoint
CREATE INDEX `control_plans_family_idx` ON `control_plans` (`part_family_id`);--> statement-breakpoint
CREATE TABLE `site_clocks` (
	`site_id` text PRIMARY KEY NOT NULL,
	`time_zone` text NOT NULL,
	`shift_starts` text NOT NULL,
	`updated_by` text,
	`updated_at` text,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`updated_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
