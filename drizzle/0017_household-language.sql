ALTER TABLE `household` ADD `language` enum('en','es') DEFAULT 'en' NOT NULL;--> statement-breakpoint
ALTER TABLE `proposal` ADD `locale` enum('en','es') DEFAULT 'en' NOT NULL;