-- One name per record: a run's raw data per part is a "sample" on every screen, so the table says so too.
-- RENAME keeps every row and the foreign key to test_runs; SQLite cannot rename an index, so it is recreated under the new name.
ALTER TABLE `test_results` RENAME TO `test_samples`;--> statement-breakpoint
DROP INDEX `test_results_run_idx`;--> statement-breakpoint
CREATE INDEX `test_samples_run_idx` ON `test_samples` (`run_id`);
