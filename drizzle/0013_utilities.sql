CREATE TABLE `utility` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`name` varchar(200) NOT NULL,
	`time_zone` varchar(64) NOT NULL,
	`territory_notes` text,
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `utility_id` PRIMARY KEY(`id`),
	CONSTRAINT `utility_company_name_uq` UNIQUE(`company_id`,`name`)
);
--> statement-breakpoint
ALTER TABLE `deal` ADD `utility_id` varchar(36);--> statement-breakpoint
ALTER TABLE `rate_plan` ADD `utility_id` varchar(36);--> statement-breakpoint
ALTER TABLE `utility` ADD CONSTRAINT `utility_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `deal` ADD CONSTRAINT `deal_utility_id_utility_id_fk` FOREIGN KEY (`utility_id`) REFERENCES `utility`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `rate_plan` ADD CONSTRAINT `rate_plan_utility_id_utility_id_fk` FOREIGN KEY (`utility_id`) REFERENCES `utility`(`id`) ON DELETE cascade ON UPDATE no action;