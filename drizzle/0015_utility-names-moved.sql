ALTER TABLE `rate_plan` MODIFY COLUMN `utility_id` varchar(36) NOT NULL;--> statement-breakpoint
ALTER TABLE `deal` DROP COLUMN `utility_name`;--> statement-breakpoint
ALTER TABLE `rate_plan` DROP COLUMN `utility_name`;