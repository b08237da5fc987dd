CREATE TABLE `battery_model` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`manufacturer` varchar(100) NOT NULL,
	`model` varchar(100) NOT NULL,
	`usable_kwh` double NOT NULL,
	`continuous_kw` double NOT NULL,
	`peak_kw` double NOT NULL,
	`round_trip_efficiency_pct` double NOT NULL,
	`depth_of_discharge_pct` double NOT NULL,
	`warranty_years` int NOT NULL,
	`warranty_throughput_mwh` double,
	`coupling` enum('ac','dc') NOT NULL,
	`active` boolean NOT NULL DEFAULT true,
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `battery_model_id` PRIMARY KEY(`id`),
	CONSTRAINT `battery_model_uq` UNIQUE(`company_id`,`manufacturer`,`model`)
);
--> statement-breakpoint
ALTER TABLE `battery_model` ADD CONSTRAINT `battery_model_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;