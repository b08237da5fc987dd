-- Hand-written data migration (drizzle-kit generate --custom): sites stored at 0, 0 (a blank
-- position saved as zero before positions were checked) get the average position of the same
-- company's other sites in the same ZIP code, and each of their deals says so on its Timeline.
-- Sites with no such neighbour stay as they are: the Household tab names the problem and the
-- form refuses to save until the rep sets the position.
INSERT INTO `timeline_event` (`id`, `company_id`, `deal_id`, `kind`, `summary`)
SELECT UUID(), d.`company_id`, d.`id`, 'household.position_repaired',
  CONCAT('The site was stored at 0, 0; it was set to the average position of the company''s other sites in ZIP ', h.`postal_code`, ': check it at the house')
FROM `deal` d
INNER JOIN `household` h ON h.`id` = d.`household_id` AND h.`company_id` = d.`company_id`
WHERE ABS(h.`latitude`) < 0.01 AND ABS(h.`longitude`) < 0.01
  AND EXISTS (
    SELECT 1 FROM `household` n
    WHERE n.`company_id` = h.`company_id` AND n.`postal_code` = h.`postal_code`
      AND NOT (ABS(n.`latitude`) < 0.01 AND ABS(n.`longitude`) < 0.01)
  );
--> statement-breakpoint
UPDATE `household` h
INNER JOIN (
  SELECT `company_id`, `postal_code`, AVG(`latitude`) AS `latitude`, AVG(`longitude`) AS `longitude`
  FROM `household`
  WHERE NOT (ABS(`latitude`) < 0.01 AND ABS(`longitude`) < 0.01)
  GROUP BY `company_id`, `postal_code`
) n ON n.`company_id` = h.`company_id` AND n.`postal_code` = h.`postal_code`
SET h.`latitude` = n.`latitude`, h.`longitude` = n.`longitude`
WHERE ABS(h.`latitude`) < 0.01 AND ABS(h.`longitude`) < 0.01;
