CREATE TABLE `bos_part` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`kind` enum('rail','splice','attachment','mid_clamp','end_clamp','mlpe','combiner','disconnect','breaker','fuse','conductor','conduit','label') NOT NULL,
	`manufacturer` varchar(100) NOT NULL,
	`model` varchar(100) NOT NULL,
	`details` json NOT NULL,
	`price_line_item_id` varchar(40),
	`active` boolean NOT NULL DEFAULT true,
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `bos_part_id` PRIMARY KEY(`id`),
	CONSTRAINT `bos_part_uq` UNIQUE(`company_id`,`manufacturer`,`model`)
);
--> statement-breakpoint
CREATE TABLE `roof_survey` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`deal_id` varchar(36) NOT NULL,
	`design_wind_mph` int,
	`ground_snow_psf` int,
	`home_run_m` double,
	`roof_plan_area_m2` double,
	`faces` json NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `roof_survey_id` PRIMARY KEY(`id`),
	CONSTRAINT `roof_survey_deal_uq` UNIQUE(`company_id`,`deal_id`)
);
--> statement-breakpoint
ALTER TABLE `bos_part` ADD CONSTRAINT `bos_part_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `roof_survey` ADD CONSTRAINT `roof_survey_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `roof_survey` ADD CONSTRAINT `roof_survey_deal_id_deal_id_fk` FOREIGN KEY (`deal_id`) REFERENCES `deal`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `bos_part_kind_idx` ON `bos_part` (`company_id`,`kind`);