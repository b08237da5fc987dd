CREATE TABLE `deals_revision` (
	`company_id` varchar(36) NOT NULL,
	`revision` bigint unsigned NOT NULL DEFAULT 0,
	`households` bigint unsigned NOT NULL DEFAULT 0,
	CONSTRAINT `deals_revision_company_id` PRIMARY KEY(`company_id`)
);
--> statement-breakpoint
ALTER TABLE `deals_revision` ADD CONSTRAINT `deals_revision_company_id_company_id_fk` FOREIGN KEY (`company_id`) REFERENCES `company`(`id`) ON DELETE cascade ON UPDATE no action;
--> statement-breakpoint
-- Every company starts with a revision, so that a user's rename below finds its row.
INSERT INTO `deals_revision` (`company_id`, `revision`, `households`) SELECT `id`, 1, 1 FROM `company`;
--> statement-breakpoint
-- The triggers bump the company's revision inside the writer's transaction. MariaDB fires no
-- trigger for foreign-key cascades, so the parents that cascade into deals (household, user)
-- have their own.
CREATE TRIGGER `deal_revision_insert` AFTER INSERT ON `deal` FOR EACH ROW
  INSERT INTO `deals_revision` (`company_id`, `revision`) VALUES (NEW.`company_id`, 1)
  ON DUPLICATE KEY UPDATE `revision` = `revision` + 1;
--> statement-breakpoint
CREATE TRIGGER `deal_revision_update` AFTER UPDATE ON `deal` FOR EACH ROW
BEGIN
  IF NOT (OLD.`company_id` <=> NEW.`company_id` AND OLD.`household_id` <=> NEW.`household_id`
      AND OLD.`owner_user_id` <=> NEW.`owner_user_id` AND OLD.`stage` <=> NEW.`stage`
      AND OLD.`stage_changed_at` <=> NEW.`stage_changed_at` AND OLD.`source` <=> NEW.`source`
      AND OLD.`contract_cents` <=> NEW.`contract_cents` AND OLD.`system_dc_watts` <=> NEW.`system_dc_watts`
      AND OLD.`created_at` <=> NEW.`created_at`) THEN
    INSERT INTO `deals_revision` (`company_id`, `revision`) VALUES (NEW.`company_id`, 1)
    ON DUPLICATE KEY UPDATE `revision` = `revision` + 1;
    IF NOT (OLD.`company_id` <=> NEW.`company_id`) THEN
      UPDATE `deals_revision` SET `revision` = `revision` + 1 WHERE `company_id` = OLD.`company_id`;
    END IF;
  END IF;
END;
--> statement-breakpoint
CREATE TRIGGER `deal_revision_delete` AFTER DELETE ON `deal` FOR EACH ROW
  UPDATE `deals_revision` SET `revision` = `revision` + 1 WHERE `company_id` = OLD.`company_id`;
--> statement-breakpoint
CREATE TRIGGER `household_revision_insert` AFTER INSERT ON `household` FOR EACH ROW
  INSERT INTO `deals_revision` (`company_id`, `revision`, `households`) VALUES (NEW.`company_id`, 1, 1)
  ON DUPLICATE KEY UPDATE `revision` = `revision` + 1, `households` = `households` + 1;
--> statement-breakpoint
CREATE TRIGGER `household_revision_update` AFTER UPDATE ON `household` FOR EACH ROW
  UPDATE `deals_revision` SET `revision` = `revision` + 1, `households` = `households` + 1
  WHERE `company_id` IN (OLD.`company_id`, NEW.`company_id`)
    AND NOT (OLD.`company_id` <=> NEW.`company_id` AND OLD.`name` <=> NEW.`name`
      AND OLD.`contact_name` <=> NEW.`contact_name` AND OLD.`street` <=> NEW.`street` AND OLD.`city` <=> NEW.`city`);
--> statement-breakpoint
CREATE TRIGGER `household_revision_delete` AFTER DELETE ON `household` FOR EACH ROW
  UPDATE `deals_revision` SET `revision` = `revision` + 1, `households` = `households` + 1 WHERE `company_id` = OLD.`company_id`;
--> statement-breakpoint
CREATE TRIGGER `user_revision_update` AFTER UPDATE ON `user` FOR EACH ROW
  UPDATE `deals_revision` SET `revision` = `revision` + 1
  WHERE NOT (OLD.`name` <=> NEW.`name`)
    AND `company_id` IN (SELECT `company_id` FROM `deal` WHERE `owner_user_id` = NEW.`id`);
--> statement-breakpoint
CREATE TRIGGER `user_revision_delete` BEFORE DELETE ON `user` FOR EACH ROW
  UPDATE `deals_revision` SET `revision` = `revision` + 1
  WHERE `company_id` IN (SELECT `company_id` FROM `deal` WHERE `owner_user_id` = OLD.`id`);
