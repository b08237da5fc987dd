CREATE TABLE `outbound_mail` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`kind` varchar(60) NOT NULL,
	`to_addresses` json NOT NULL,
	`reply_to` varchar(320),
	`subject` varchar(500) NOT NULL,
	`html` mediumtext,
	`text` mediumtext,
	`idempotency_key` varchar(256) NOT NULL,
	`status` enum('pending','sent','failed') NOT NULL DEFAULT 'pending',
	`attempts` int NOT NULL DEFAULT 0,
	`next_attempt_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`sent_at` timestamp(3),
	`provider_id` varchar(100),
	`last_error` varchar(500),
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `outbound_mail_id` PRIMARY KEY(`id`),
	CONSTRAINT `outbound_mail_idempotency_key_unique` UNIQUE(`idempotency_key`)
);
--> statement-breakpoint
ALTER TABLE `outbound_mail` ADD CONSTRAINT `outbound_mail_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `outbound_mail_due_idx` ON `outbound_mail` (`status`,`next_attempt_at`);--> statement-breakpoint
CREATE INDEX `outbound_mail_company_idx` ON `outbound_mail` (`company_id`,`created_at`);