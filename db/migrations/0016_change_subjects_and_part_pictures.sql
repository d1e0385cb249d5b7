CREATE TABLE `change_request_equipment` (
	`change_request_id` text PRIMARY KEY NOT NULL,
	`system_id` text NOT NULL,
	`before` text NOT NULL,
	`after` text NOT NULL,
	`applied_at` text,
	`created_at` text NOT NULL,
	FOREIGN KEY (`change_request_id`) REFERENCES `change_requests`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`system_id`) REFERENCES `cleaning_systems`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `change_request_specs` (
	`change_request_id` text PRIMARY KEY NOT NULL,
	`from_spec_id` text NOT NULL,
	`to_spec_id` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`change_request_id`) REFERENCES `change_requests`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`from_spec_id`) REFERENCES `cleanliness_specs`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`to_spec_id`) REFERENCES `cleanliness_specs`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `part_family_pictures` (
	`part_family_id` text PRIMARY KEY NOT NULL,
	`file_id` text NOT NULL,
	`uploaded_by` text NOT NULL,
	`uploaded_at` text NOT NULL,
	FOREIGN KEY (`part_family_id`) REFERENCES `part_families`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`file_id`) REFERENCES `evidence_files`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`uploaded_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
