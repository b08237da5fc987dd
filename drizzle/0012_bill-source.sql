ALTER TABLE `bill` ADD `source` enum('typed','bill','history') DEFAULT 'typed' NOT NULL;--> statement-breakpoint
ALTER TABLE `bill` ADD `period_estimated` boolean DEFAULT false NOT NULL;