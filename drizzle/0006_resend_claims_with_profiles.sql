-- Claims now carry a gold profile. Give each a new change number so devices pull them again
-- (a device keeps a claim until its number moves), and move the counter past them.
UPDATE `claims` SET `seq` = (SELECT coalesce(max(`value`), 0) FROM `sequences` WHERE `name` = 'change') + (SELECT count(*) FROM `claims` c2 WHERE c2.`rowid` <= `claims`.`rowid`);
--> statement-breakpoint
INSERT INTO `sequences` (`name`, `value`) SELECT 'change', coalesce(max(`seq`), 0) FROM `claims` WHERE true ON CONFLICT(`name`) DO UPDATE SET `value` = max(`value`, excluded.`value`);
