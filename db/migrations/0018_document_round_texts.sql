CREATE TABLE `document_round_texts` (
	`id` text PRIMARY KEY NOT NULL,
	`version_id` text NOT NULL,
	`round` integer NOT NULL,
	`content_hash` text NOT NULL,
	`content` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`version_id`) REFERENCES `document_versions`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `document_round_texts_uq` ON `document_round_texts` (`version_id`,`round`);