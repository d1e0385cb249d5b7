CREATE INDEX `recipes_system_idx` ON `recipes` (`system_id`);--> statement-breakpoint
CREATE INDEX `test_runs_family_status_idx` ON `test_runs` (`part_family_id`,`status`,`performed_on`);