ALTER TABLE `cleaning_systems` ADD `asset_number` text;--> statement-breakpoint
ALTER TABLE `cleaning_systems` ADD `retired_at` text;--> statement-breakpoint
ALTER TABLE `cleaning_systems` ADD `retire_reason` text;--> statement-breakpoint
CREATE UNIQUE INDEX `cleaning_systems_asset_number_unique` ON `cleaning_systems` (`asset_number`);--> statement-breakpoint
ALTER TABLE `system_stages` ADD `filter_rating_um` real;--> statement-breakpoint
ALTER TABLE `system_stages` ADD `ultrasonic_power_w` real;--> statement-breakpoint
ALTER TABLE `system_stages` ADD `ultrasonic_frequency_khz` real;--> statement-breakpoint
ALTER TABLE `system_stages` ADD `spray_pressure_bar` real;--> statement-breakpoint
ALTER TABLE `system_stages` ADD `injection_pressure_bar` real;--> statement-breakpoint
ALTER TABLE `system_stages` ADD `nozzle_set` text;