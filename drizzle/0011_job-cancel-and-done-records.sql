ALTER TABLE `job` ADD `survey_done_on` date;--> statement-breakpoint
ALTER TABLE `job` ADD `inspection_passed_on` date;--> statement-breakpoint
ALTER TABLE `job` ADD `cancelled_at` timestamp(3);--> statement-breakpoint
ALTER TABLE `job` ADD `cancel_reason` varchar(300);