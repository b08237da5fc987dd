CREATE TABLE `bill` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`deal_id` varchar(36) NOT NULL,
	`period_start` date NOT NULL,
	`period_end` date NOT NULL,
	`kwh` double NOT NULL,
	`cost_cents` int,
	`upload_id` varchar(36),
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `bill_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `design` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`deal_id` varchar(36) NOT NULL,
	`document` json NOT NULL,
	`weather_station_id` varchar(36),
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `design_id` PRIMARY KEY(`id`),
	CONSTRAINT `design_deal_uq` UNIQUE(`company_id`,`deal_id`)
);
--> statement-breakpoint
CREATE TABLE `discount_request` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`deal_id` varchar(36) NOT NULL,
	`offer_id` varchar(36) NOT NULL,
	`amount_cents` int NOT NULL,
	`reason` text NOT NULL,
	`status` enum('pending','approved','declined') NOT NULL DEFAULT 'pending',
	`requested_by_user_id` varchar(36),
	`decided_by_user_id` varchar(36),
	`decided_at` timestamp(3),
	`decision_note` text,
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `discount_request_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `interval_profile` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`deal_id` varchar(36) NOT NULL,
	`upload_id` varchar(36),
	`hourly_kwh` json NOT NULL,
	`annual_kwh` double NOT NULL,
	`coverage_pct` double NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `interval_profile_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `inverter_model` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`manufacturer` varchar(100) NOT NULL,
	`model` varchar(100) NOT NULL,
	`kind` enum('string','micro') NOT NULL,
	`ac_watts` double NOT NULL,
	`efficiency_pct` double NOT NULL,
	`max_dc_voltage_v` double,
	`mppt_min_v` double,
	`mppt_max_v` double,
	`max_input_current_a` double,
	`mppt_count` int,
	`dc_input_min_v` double,
	`dc_input_max_v` double,
	`modules_per_unit` int,
	`active` boolean NOT NULL DEFAULT true,
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `inverter_model_id` PRIMARY KEY(`id`),
	CONSTRAINT `inverter_model_uq` UNIQUE(`company_id`,`manufacturer`,`model`)
);
--> statement-breakpoint
CREATE TABLE `module_model` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`manufacturer` varchar(100) NOT NULL,
	`model` varchar(100) NOT NULL,
	`stc_watts` double NOT NULL,
	`voc_v` double NOT NULL,
	`isc_a` double NOT NULL,
	`vmp_v` double NOT NULL,
	`imp_a` double NOT NULL,
	`gamma_pmax_pct_per_c` double NOT NULL,
	`beta_voc_pct_per_c` double NOT NULL,
	`length_mm` int NOT NULL,
	`width_mm` int NOT NULL,
	`cell_technology` enum('mono_perc','topcon','heterojunction','back_contact','polycrystalline','thin_film_cdte','thin_film_cigs') NOT NULL,
	`construction` enum('glass_glass','glass_backsheet') NOT NULL,
	`encapsulant` varchar(50),
	`active` boolean NOT NULL DEFAULT true,
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `module_model_id` PRIMARY KEY(`id`),
	CONSTRAINT `module_model_uq` UNIQUE(`company_id`,`manufacturer`,`model`)
);
--> statement-breakpoint
CREATE TABLE `offer` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`deal_id` varchar(36) NOT NULL,
	`position` int NOT NULL,
	`name` varchar(100) NOT NULL,
	`inputs` json NOT NULL,
	`results` json NOT NULL,
	`discount_cents` int NOT NULL DEFAULT 0,
	`discount_status` enum('none','within_limit','pending','approved','declined') NOT NULL DEFAULT 'none',
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `offer_id` PRIMARY KEY(`id`),
	CONSTRAINT `offer_position_uq` UNIQUE(`company_id`,`deal_id`,`position`)
);
--> statement-breakpoint
CREATE TABLE `price_book` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`document` json NOT NULL,
	`updated_by_user_id` varchar(36),
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `price_book_id` PRIMARY KEY(`id`),
	CONSTRAINT `price_book_company_uq` UNIQUE(`company_id`)
);
--> statement-breakpoint
CREATE TABLE `rate_plan` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`name` varchar(200) NOT NULL,
	`utility_name` varchar(200) NOT NULL,
	`plan` json NOT NULL,
	`active` boolean NOT NULL DEFAULT true,
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `rate_plan_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `timeline_event` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`deal_id` varchar(36) NOT NULL,
	`kind` varchar(50) NOT NULL,
	`summary` varchar(500) NOT NULL,
	`data` json,
	`actor_user_id` varchar(36),
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `timeline_event_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `upload` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`deal_id` varchar(36),
	`purpose` enum('bill','interval_data','weather','site_photo') NOT NULL,
	`file_name` varchar(255) NOT NULL,
	`mime_type` varchar(100) NOT NULL,
	`size_bytes` int NOT NULL,
	`sha256` varchar(64) NOT NULL,
	`storage_key` varchar(255) NOT NULL,
	`extracted_text` text,
	`uploaded_by_user_id` varchar(36),
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `upload_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `weather_station` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`name` varchar(200) NOT NULL,
	`format` enum('epw','tmy3','csv') NOT NULL,
	`latitude` double NOT NULL,
	`longitude` double NOT NULL,
	`elevation_m` double NOT NULL,
	`utc_offset_hours` double NOT NULL,
	`attribution` text NOT NULL,
	`annual_ghi_kwh_per_m2` double NOT NULL,
	`upload_id` varchar(36) NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `weather_station_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `deal` ADD `utility_name` varchar(200);--> statement-breakpoint
ALTER TABLE `deal` ADD `rate_plan_id` varchar(36);--> statement-breakpoint
ALTER TABLE `household` ADD `contact_name` varchar(200);--> statement-breakpoint
ALTER TABLE `household` ADD `second_contact_name` varchar(200);--> statement-breakpoint
ALTER TABLE `household` ADD `second_contact_email` varchar(320);--> statement-breakpoint
ALTER TABLE `household` ADD `second_contact_phone` varchar(40);--> statement-breakpoint
ALTER TABLE `bill` ADD CONSTRAINT `bill_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `bill` ADD CONSTRAINT `bill_deal_id_deal_id_fk` FOREIGN KEY (`deal_id`) REFERENCES `deal`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `bill` ADD CONSTRAINT `bill_upload_id_upload_id_fk` FOREIGN KEY (`upload_id`) REFERENCES `upload`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `design` ADD CONSTRAINT `design_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `design` ADD CONSTRAINT `design_deal_id_deal_id_fk` FOREIGN KEY (`deal_id`) REFERENCES `deal`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `design` ADD CONSTRAINT `design_weather_station_id_weather_station_id_fk` FOREIGN KEY (`weather_station_id`) REFERENCES `weather_station`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `discount_request` ADD CONSTRAINT `discount_request_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `discount_request` ADD CONSTRAINT `discount_request_deal_id_deal_id_fk` FOREIGN KEY (`deal_id`) REFERENCES `deal`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `discount_request` ADD CONSTRAINT `discount_request_offer_id_offer_id_fk` FOREIGN KEY (`offer_id`) REFERENCES `offer`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `discount_request` ADD CONSTRAINT `discount_request_requested_by_user_id_user_id_fk` FOREIGN KEY (`requested_by_user_id`) REFERENCES `user`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `discount_request` ADD CONSTRAINT `discount_request_decided_by_user_id_user_id_fk` FOREIGN KEY (`decided_by_user_id`) REFERENCES `user`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `interval_profile` ADD CONSTRAINT `interval_profile_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `interval_profile` ADD CONSTRAINT `interval_profile_deal_id_deal_id_fk` FOREIGN KEY (`deal_id`) REFERENCES `deal`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `interval_profile` ADD CONSTRAINT `interval_profile_upload_id_upload_id_fk` FOREIGN KEY (`upload_id`) REFERENCES `upload`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `inverter_model` ADD CONSTRAINT `inverter_model_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `module_model` ADD CONSTRAINT `module_model_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `offer` ADD CONSTRAINT `offer_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `offer` ADD CONSTRAINT `offer_deal_id_deal_id_fk` FOREIGN KEY (`deal_id`) REFERENCES `deal`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `price_book` ADD CONSTRAINT `price_book_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `price_book` ADD CONSTRAINT `price_book_updated_by_user_id_user_id_fk` FOREIGN KEY (`updated_by_user_id`) REFERENCES `user`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `rate_plan` ADD CONSTRAINT `rate_plan_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `timeline_event` ADD CONSTRAINT `timeline_event_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `timeline_event` ADD CONSTRAINT `timeline_event_deal_id_deal_id_fk` FOREIGN KEY (`deal_id`) REFERENCES `deal`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `timeline_event` ADD CONSTRAINT `timeline_event_actor_user_id_user_id_fk` FOREIGN KEY (`actor_user_id`) REFERENCES `user`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `upload` ADD CONSTRAINT `upload_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `upload` ADD CONSTRAINT `upload_deal_id_deal_id_fk` FOREIGN KEY (`deal_id`) REFERENCES `deal`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `upload` ADD CONSTRAINT `upload_uploaded_by_user_id_user_id_fk` FOREIGN KEY (`uploaded_by_user_id`) REFERENCES `user`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `weather_station` ADD CONSTRAINT `weather_station_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `weather_station` ADD CONSTRAINT `weather_station_upload_id_upload_id_fk` FOREIGN KEY (`upload_id`) REFERENCES `upload`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `bill_deal_idx` ON `bill` (`company_id`,`deal_id`,`period_start`);--> statement-breakpoint
CREATE INDEX `discount_request_company_idx` ON `discount_request` (`company_id`,`status`);--> statement-breakpoint
CREATE INDEX `interval_profile_deal_idx` ON `interval_profile` (`company_id`,`deal_id`);--> statement-breakpoint
CREATE INDEX `rate_plan_company_idx` ON `rate_plan` (`company_id`);--> statement-breakpoint
CREATE INDEX `timeline_event_deal_idx` ON `timeline_event` (`company_id`,`deal_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `upload_deal_idx` ON `upload` (`company_id`,`deal_id`);--> statement-breakpoint
CREATE INDEX `weather_station_company_idx` ON `weather_station` (`company_id`);