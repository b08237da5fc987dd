CREATE TABLE `deal_usage` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`deal_id` varchar(36) NOT NULL,
	`version` int NOT NULL DEFAULT 1,
	`source` enum('bills','interval','none') NOT NULL,
	`monthly_kwh` json NOT NULL,
	`hourly_kwh` json,
	`annual_kwh` double NOT NULL,
	`estimated_months` json NOT NULL,
	`warnings` json NOT NULL,
	`average_cents_per_kwh` double,
	`fill_method` varchar(40) NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `deal_usage_id` PRIMARY KEY(`id`),
	CONSTRAINT `deal_usage_deal_uq` UNIQUE(`company_id`,`deal_id`)
);
--> statement-breakpoint
ALTER TABLE `company` ADD `finance_version` int DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE `design` ADD `revision` int DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE `offer` ADD `basis` json;--> statement-breakpoint
ALTER TABLE `price_book` ADD `version` int DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE `price_book` ADD `incentives_version` int DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE `rate_plan` ADD `version` int DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE `deal_usage` ADD CONSTRAINT `deal_usage_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `deal_usage` ADD CONSTRAINT `deal_usage_deal_id_deal_id_fk` FOREIGN KEY (`deal_id`) REFERENCES `deal`(`id`) ON DELETE cascade ON UPDATE no action;