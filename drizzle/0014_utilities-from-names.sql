-- Hand-written data migration (drizzle-kit generate --custom): the utilities typed as free text
-- on rate plans and deals become utility rows, one per distinct name in each company (names
-- compare without case or surrounding spaces, as the unique key does), in the company's time
-- zone. Plans and deals are then linked to them; 0012 drops the free-text columns.
INSERT INTO `utility` (`id`, `company_id`, `name`, `time_zone`)
SELECT UUID(), n.`company_id`, n.`name`, COALESCE(JSON_VALUE(c.`settings`, '$.timeZone'), 'America/New_York')
FROM (
  SELECT `company_id`, COALESCE(NULLIF(TRIM(`utility_name`), ''), 'Utility (name not recorded)') AS `name` FROM `rate_plan`
  UNION
  SELECT `company_id`, TRIM(`utility_name`) FROM `deal` WHERE TRIM(COALESCE(`utility_name`, '')) <> ''
) n
INNER JOIN `company` c ON c.`id` = n.`company_id`;
--> statement-breakpoint
UPDATE `rate_plan` p
INNER JOIN `utility` u ON u.`company_id` = p.`company_id` AND u.`name` = COALESCE(NULLIF(TRIM(p.`utility_name`), ''), 'Utility (name not recorded)')
SET p.`utility_id` = u.`id`;
--> statement-breakpoint
UPDATE `deal` d
INNER JOIN `utility` u ON u.`company_id` = d.`company_id` AND u.`name` = TRIM(d.`utility_name`)
SET d.`utility_id` = u.`id`
WHERE TRIM(COALESCE(d.`utility_name`, '')) <> '';
