CREATE INDEX `change_requests_status_idx` ON `change_requests` (`status`);--> statement-breakpoint
CREATE INDEX `test_runs_status_idx` ON `test_runs` (`status`);--> statement-breakpoint
CREATE INDEX `test_runs_performed_on_idx` ON `test_runs` (`performed_on`,`number`,`revision`);