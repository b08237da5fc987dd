ALTER TABLE `household` ADD `service_busbar_a` int;--> statement-breakpoint
ALTER TABLE `household` ADD `service_main_breaker_a` int;--> statement-breakpoint
ALTER TABLE `household` ADD `service_voltage_v` int;