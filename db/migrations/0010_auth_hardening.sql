CREATE TABLE `password_history` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` text NOT NULL,
	`password_hash` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `password_history_user_idx` ON `password_history` (`user_id`,`created_at`);--> statement-breakpoint
CREATE TABLE `sign_in_throttle` (
	`address` text PRIMARY KEY NOT NULL,
	`failures` integer DEFAULT 0 NOT NULL,
	`window_started_at` text NOT NULL,
	`blocked_until` text
);
--> statement-breakpoint
ALTER TABLE `api_tokens` ADD `expires_at` text;--> statement-breakpoint
ALTER TABLE `api_tokens` ADD `suspended_at` text;--> statement-breakpoint
ALTER TABLE `api_tokens` ADD `suspended_reason` text;