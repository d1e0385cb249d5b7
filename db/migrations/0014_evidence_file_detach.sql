ALTER TABLE `evidence_files` ADD `detached_from_run_id` text REFERENCES test_runs(id);--> statement-breakpoint
ALTER TABLE `evidence_files` ADD `detached_at` text;--> statement-breakpoint
ALTER TABLE `evidence_files` ADD `detached_by` text REFERENCES users(id);--> statement-breakpoint
ALTER TABLE `evidence_files` ADD `detach_reason` text;