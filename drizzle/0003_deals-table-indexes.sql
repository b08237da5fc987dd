CREATE INDEX `deal_company_contract_idx` ON `deal` (`company_id`,`contract_cents`);--> statement-breakpoint
CREATE INDEX `deal_company_system_idx` ON `deal` (`company_id`,`system_dc_watts`);--> statement-breakpoint
CREATE INDEX `deal_company_source_idx` ON `deal` (`company_id`,`source`);--> statement-breakpoint
CREATE INDEX `household_company_name_idx` ON `household` (`company_id`,`name`);--> statement-breakpoint
CREATE INDEX `household_company_city_idx` ON `household` (`company_id`,`city`);