DROP INDEX `test_samples_cycle_idx`;--> statement-breakpoint
CREATE INDEX `test_samples_cycle_idx` ON `test_samples` (`cycle_number`) WHERE "test_samples"."cycle_number" is not null;