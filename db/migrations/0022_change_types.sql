CREATE TABLE `change_affected_documents` (
	`id` text PRIMARY KEY NOT NULL,
	`change_request_id` text NOT NULL,
	`document_id` text NOT NULL,
	`added_by` text NOT NULL,
	`added_at` text NOT NULL,
	`unaffected_reason` text,
	`confirmed_by` text,
	`confirmed_at` text,
	FOREIGN KEY (`change_request_id`) REFERENCES `change_requests`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`document_id`) REFERENCES `documents`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`added_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`confirmed_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `change_affected_documents_uq` ON `change_affected_documents` (`change_request_id`,`document_id`);--> statement-breakpoint
CREATE TABLE `change_control_settings` (
	`id` text PRIMARY KEY NOT NULL,
	`emergency_approval_days` integer DEFAULT 3 NOT NULL,
	`effectiveness_runs` integer DEFAULT 3 NOT NULL,
	`updated_by` text,
	`updated_at` text,
	FOREIGN KEY (`updated_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `change_customer_decisions` (
	`id` text PRIMARY KEY NOT NULL,
	`change_request_id` text NOT NULL,
	`spec_id` text NOT NULL,
	`decision` text NOT NULL,
	`decided_on` text NOT NULL,
	`reference` text NOT NULL,
	`letter_file_id` text NOT NULL,
	`recorded_by` text NOT NULL,
	`recorded_at` text NOT NULL,
	FOREIGN KEY (`change_request_id`) REFERENCES `change_requests`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`spec_id`) REFERENCES `cleanliness_specs`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`letter_file_id`) REFERENCES `evidence_files`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`recorded_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `change_customer_decisions_change_idx` ON `change_customer_decisions` (`change_request_id`);--> statement-breakpoint
CREATE TABLE `change_effectiveness_checks` (
	`change_request_id` text PRIMARY KEY NOT NULL,
	`required_runs` integer NOT NULL,
	`counts_from` text NOT NULL,
	`outcome` text,
	`decided_at` text,
	`runs` text,
	FOREIGN KEY (`change_request_id`) REFERENCES `change_requests`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `change_effectiveness_pending_idx` ON `change_effectiveness_checks` (`outcome`);--> statement-breakpoint
CREATE TABLE `emergency_changes` (
	`change_request_id` text PRIMARY KEY NOT NULL,
	`justification` text NOT NULL,
	`implemented_by` text NOT NULL,
	`implemented_at` text NOT NULL,
	`approval_due_on` text NOT NULL,
	`signature_id` text NOT NULL,
	`escalated_at` text,
	FOREIGN KEY (`change_request_id`) REFERENCES `change_requests`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`implemented_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`signature_id`) REFERENCES `signatures`(`id`) ON UPDATE no action ON DELETE no action
);
