CREATE TABLE `document_reviews` (
	`id` text PRIMARY KEY NOT NULL,
	`version_id` text NOT NULL,
	`round` integer NOT NULL,
	`step` integer NOT NULL,
	`role` text NOT NULL,
	`assignee_id` text NOT NULL,
	`activated_at` text,
	`due_at` text,
	`decision` text,
	`comment` text,
	`decided_at` text,
	`overdue_notified_at` text,
	`created_at` text NOT NULL,
	FOREIGN KEY (`version_id`) REFERENCES `document_versions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`assignee_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `document_reviews_version_idx` ON `document_reviews` (`version_id`,`round`);--> statement-breakpoint
CREATE INDEX `document_reviews_assignee_idx` ON `document_reviews` (`assignee_id`,`decision`);--> statement-breakpoint
DROP INDEX `signatures_once_uq`;--> statement-breakpoint
CREATE UNIQUE INDEX `signatures_once_per_content_uq` ON `signatures` (`record_type`,`record_id`,`user_id`,`meaning`,`content_hash`);--> statement-breakpoint
ALTER TABLE `document_versions` ADD `review_round` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `document_versions` ADD `routing` text;--> statement-breakpoint
ALTER TABLE `document_versions` ADD `submitted_at` text;--> statement-breakpoint
ALTER TABLE `document_versions` ADD `approved_at` text;--> statement-breakpoint
ALTER TABLE `document_versions` ADD `change_reason` text;