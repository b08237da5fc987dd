CREATE TABLE `payment_alert` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`kind` enum('unknown_refund') NOT NULL,
	`webhook_event_id` varchar(255) NOT NULL,
	`charge_id` varchar(255),
	`payment_intent_id` varchar(255),
	`amount_cents` int,
	`detail` varchar(500) NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `payment_alert_id` PRIMARY KEY(`id`),
	CONSTRAINT `payment_alert_event_uq` UNIQUE(`webhook_event_id`)
);
--> statement-breakpoint
ALTER TABLE `payment_alert` ADD CONSTRAINT `payment_alert_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `payment_alert_company_idx` ON `payment_alert` (`company_id`,`created_at`);