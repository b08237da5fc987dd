CREATE TABLE `checklist_template` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`name` varchar(100) NOT NULL,
	`items` json NOT NULL,
	`active` boolean NOT NULL DEFAULT true,
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `checklist_template_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `crew` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`name` varchar(100) NOT NULL,
	`feed_token` varchar(64) NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `crew_id` PRIMARY KEY(`id`),
	CONSTRAINT `crew_feed_uq` UNIQUE(`feed_token`)
);
--> statement-breakpoint
CREATE TABLE `job` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`deal_id` varchar(36) NOT NULL,
	`proposal_id` varchar(36),
	`crew_id` varchar(36),
	`survey_date` date,
	`install_date` date,
	`permit_number` varchar(100),
	`permit_submitted_on` date,
	`permit_approved_on` date,
	`interconnection_number` varchar(100),
	`interconnection_submitted_on` date,
	`interconnection_approved_on` date,
	`inspection_on` date,
	`pto_on` date,
	`notes` text,
	`checklist` json,
	`installed_at` timestamp(3),
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `job_id` PRIMARY KEY(`id`),
	CONSTRAINT `job_deal_uq` UNIQUE(`company_id`,`deal_id`)
);
--> statement-breakpoint
CREATE TABLE `job_photo` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`job_id` varchar(36) NOT NULL,
	`storage_key` varchar(255) NOT NULL,
	`mime_type` varchar(100) NOT NULL,
	`width_px` int NOT NULL,
	`height_px` int NOT NULL,
	`size_bytes` int NOT NULL,
	`caption` varchar(200),
	`uploaded_by_user_id` varchar(36),
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `job_photo_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `payment` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`deal_id` varchar(36) NOT NULL,
	`proposal_id` varchar(36) NOT NULL,
	`checkout_session_id` varchar(255) NOT NULL,
	`payment_intent_id` varchar(255),
	`charge_id` varchar(255),
	`amount_cents` int NOT NULL,
	`currency` varchar(3) NOT NULL DEFAULT 'usd',
	`paid_cents` int,
	`refunded_cents` int NOT NULL DEFAULT 0,
	`status` enum('open','paid','failed','expired','flagged','refunded','partially_refunded') NOT NULL DEFAULT 'open',
	`flag_reason` varchar(500),
	`failure_message` varchar(500),
	`paid_at` timestamp(3),
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `payment_id` PRIMARY KEY(`id`),
	CONSTRAINT `payment_session_uq` UNIQUE(`checkout_session_id`)
);
--> statement-breakpoint
CREATE TABLE `proposal` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`deal_id` varchar(36) NOT NULL,
	`number` int NOT NULL,
	`version` int NOT NULL,
	`status` enum('sent','replaced','revoked','signed','cancelled') NOT NULL DEFAULT 'sent',
	`snapshot` json NOT NULL,
	`pdf_storage_key` varchar(255) NOT NULL,
	`pdf_sha256` varchar(64) NOT NULL,
	`token_hash` varchar(64) NOT NULL,
	`expires_at` timestamp(3) NOT NULL,
	`revoked_at` timestamp(3),
	`replaced_by_proposal_id` varchar(36),
	`sent_to_email` varchar(320) NOT NULL,
	`sent_by_user_id` varchar(36),
	`in_home_sale` boolean NOT NULL DEFAULT true,
	`first_opened_at` timestamp(3),
	`last_viewed_at` timestamp(3),
	`chosen_position` int,
	`code_hash` varchar(64),
	`code_expires_at` timestamp(3),
	`code_attempts` int NOT NULL DEFAULT 0,
	`code_verified_at` timestamp(3),
	`consented_at` timestamp(3),
	`signed_at` timestamp(3),
	`signer_name` varchar(200),
	`signer_email` varchar(320),
	`signer_ip` varchar(64),
	`signer_user_agent` varchar(500),
	`signed_storage_key` varchar(255),
	`signed_sha256` varchar(64),
	`cancel_deadline` date,
	`cancelled_at` timestamp(3),
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `proposal_id` PRIMARY KEY(`id`),
	CONSTRAINT `proposal_token_uq` UNIQUE(`token_hash`),
	CONSTRAINT `proposal_version_uq` UNIQUE(`company_id`,`number`,`version`),
	CONSTRAINT `proposal_signed_sha_uq` UNIQUE(`signed_sha256`)
);
--> statement-breakpoint
CREATE TABLE `proposal_event` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`proposal_id` varchar(36) NOT NULL,
	`kind` varchar(40) NOT NULL,
	`body` text,
	`ip` varchar(64),
	`user_agent` varchar(500),
	`actor_user_id` varchar(36),
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `proposal_event_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `refund` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`payment_id` varchar(36) NOT NULL,
	`deal_id` varchar(36) NOT NULL,
	`stripe_refund_id` varchar(255) NOT NULL,
	`amount_cents` int NOT NULL,
	`status` varchar(40) NOT NULL,
	`reason` varchar(500) NOT NULL,
	`requested_by_user_id` varchar(36),
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `refund_id` PRIMARY KEY(`id`),
	CONSTRAINT `refund_stripe_uq` UNIQUE(`stripe_refund_id`)
);
--> statement-breakpoint
CREATE TABLE `saved_view` (
	`id` varchar(36) NOT NULL,
	`company_id` varchar(36) NOT NULL,
	`user_id` varchar(36) NOT NULL,
	`name` varchar(100) NOT NULL,
	`query` json NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `saved_view_id` PRIMARY KEY(`id`),
	CONSTRAINT `saved_view_name_uq` UNIQUE(`company_id`,`user_id`,`name`)
);
--> statement-breakpoint
CREATE TABLE `webhook_event` (
	`id` varchar(255) NOT NULL,
	`type` varchar(100) NOT NULL,
	`outcome` varchar(40) NOT NULL,
	`note` varchar(500),
	`created_at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `webhook_event_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `company` ADD `settings` json;--> statement-breakpoint
ALTER TABLE `membership` ADD `crew_id` varchar(36);--> statement-breakpoint
ALTER TABLE `checklist_template` ADD CONSTRAINT `checklist_template_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `crew` ADD CONSTRAINT `crew_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `job` ADD CONSTRAINT `job_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `job` ADD CONSTRAINT `job_deal_id_deal_id_fk` FOREIGN KEY (`deal_id`) REFERENCES `deal`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `job` ADD CONSTRAINT `job_proposal_id_proposal_id_fk` FOREIGN KEY (`proposal_id`) REFERENCES `proposal`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `job` ADD CONSTRAINT `job_crew_id_crew_id_fk` FOREIGN KEY (`crew_id`) REFERENCES `crew`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `job_photo` ADD CONSTRAINT `job_photo_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `job_photo` ADD CONSTRAINT `job_photo_job_id_job_id_fk` FOREIGN KEY (`job_id`) REFERENCES `job`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `job_photo` ADD CONSTRAINT `job_photo_uploaded_by_user_id_user_id_fk` FOREIGN KEY (`uploaded_by_user_id`) REFERENCES `user`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `payment` ADD CONSTRAINT `payment_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `payment` ADD CONSTRAINT `payment_deal_id_deal_id_fk` FOREIGN KEY (`deal_id`) REFERENCES `deal`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `payment` ADD CONSTRAINT `payment_proposal_id_proposal_id_fk` FOREIGN KEY (`proposal_id`) REFERENCES `proposal`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `proposal` ADD CONSTRAINT `proposal_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `proposal` ADD CONSTRAINT `proposal_deal_id_deal_id_fk` FOREIGN KEY (`deal_id`) REFERENCES `deal`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `proposal` ADD CONSTRAINT `proposal_sent_by_user_id_user_id_fk` FOREIGN KEY (`sent_by_user_id`) REFERENCES `user`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `proposal_event` ADD CONSTRAINT `proposal_event_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `proposal_event` ADD CONSTRAINT `proposal_event_proposal_id_proposal_id_fk` FOREIGN KEY (`proposal_id`) REFERENCES `proposal`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `proposal_event` ADD CONSTRAINT `proposal_event_actor_user_id_user_id_fk` FOREIGN KEY (`actor_user_id`) REFERENCES `user`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `refund` ADD CONSTRAINT `refund_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `refund` ADD CONSTRAINT `refund_payment_id_payment_id_fk` FOREIGN KEY (`payment_id`) REFERENCES `payment`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `refund` ADD CONSTRAINT `refund_deal_id_deal_id_fk` FOREIGN KEY (`deal_id`) REFERENCES `deal`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `refund` ADD CONSTRAINT `refund_requested_by_user_id_user_id_fk` FOREIGN KEY (`requested_by_user_id`) REFERENCES `user`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `saved_view` ADD CONSTRAINT `saved_view_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `saved_view` ADD CONSTRAINT `saved_view_user_id_user_id_fk` FOREIGN KEY (`user_id`) REFERENCES `user`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `checklist_template_company_idx` ON `checklist_template` (`company_id`);--> statement-breakpoint
CREATE INDEX `crew_company_idx` ON `crew` (`company_id`);--> statement-breakpoint
CREATE INDEX `job_crew_idx` ON `job` (`company_id`,`crew_id`,`install_date`);--> statement-breakpoint
CREATE INDEX `job_photo_job_idx` ON `job_photo` (`company_id`,`job_id`);--> statement-breakpoint
CREATE INDEX `payment_deal_idx` ON `payment` (`company_id`,`deal_id`);--> statement-breakpoint
CREATE INDEX `proposal_deal_idx` ON `proposal` (`company_id`,`deal_id`);--> statement-breakpoint
CREATE INDEX `proposal_event_proposal_idx` ON `proposal_event` (`company_id`,`proposal_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `refund_payment_idx` ON `refund` (`company_id`,`payment_id`);--> statement-breakpoint
CREATE INDEX `deal_company_changed_idx` ON `deal` (`company_id`,`stage_changed_at`);--> statement-breakpoint
CREATE INDEX `deal_company_created_idx` ON `deal` (`company_id`,`created_at`);