ALTER TABLE `finds` ADD `purity` real;
--> statement-breakpoint
ALTER TABLE `finds` ADD `weighed_fine` real;
--> statement-breakpoint
ALTER TABLE `finds` ADD `weighed_low` real;
--> statement-breakpoint
ALTER TABLE `finds` ADD `weighed_high` real;
--> statement-breakpoint
ALTER TABLE `finds` ADD `weighed_air` real;
--> statement-breakpoint
ALTER TABLE `finds` ADD `assay_fine` real;
--> statement-breakpoint
ALTER TABLE `finds` ADD `assay_low` real;
--> statement-breakpoint
ALTER TABLE `finds` ADD `assay_high` real;
--> statement-breakpoint
ALTER TABLE `finds` ADD `fineness_used` real;
--> statement-breakpoint
ALTER TABLE `finds` ADD `fineness_used_low` real;
--> statement-breakpoint
ALTER TABLE `finds` ADD `fineness_used_high` real;
--> statement-breakpoint
ALTER TABLE `finds` ADD `fineness_used_basis` text;
--> statement-breakpoint
ALTER TABLE `claims` ADD `fineness` real DEFAULT 825 NOT NULL;
--> statement-breakpoint
ALTER TABLE `claims` ADD `fineness_low` real DEFAULT 700 NOT NULL;
--> statement-breakpoint
ALTER TABLE `claims` ADD `fineness_high` real DEFAULT 950 NOT NULL;
--> statement-breakpoint
ALTER TABLE `claims` ADD `fineness_source` text DEFAULT 'Club preset: natural gold, fineness unknown (Lindgren, USGS PP 73 (1911); Macdonald (2007) Table 1.7: most native gold 700–950 ‰)' NOT NULL;
--> statement-breakpoint
ALTER TABLE `claims` ADD `host_density` real DEFAULT 2.65 NOT NULL;
--> statement-breakpoint
ALTER TABLE `claims` ADD `host_density_low` real DEFAULT 2.62 NOT NULL;
--> statement-breakpoint
ALTER TABLE `claims` ADD `host_density_high` real DEFAULT 2.68 NOT NULL;
--> statement-breakpoint
ALTER TABLE `claims` ADD `host_density_source` text DEFAULT 'Club preset: clean quartz (Holland & Powell ds62: quartz 2.648 g/cm³)' NOT NULL;
--> statement-breakpoint
ALTER TABLE `weigh_ins` ADD `air_grams` real;
--> statement-breakpoint
-- The weigh-in figures kept so far become the weigh-in inputs of the new rule.
UPDATE `finds` SET `weighed_fine` = `latest_fine_grams`, `weighed_low` = `latest_fine_low`, `weighed_high` = `latest_fine_high`;
--> statement-breakpoint
UPDATE `weigh_ins` SET `air_grams` = (SELECT avg(value) FROM json_each(`weigh_ins`.`input`, '$.airGrams'));
--> statement-breakpoint
UPDATE `finds` SET `weighed_air` = (SELECT w.`air_grams` FROM `weigh_ins` w WHERE w.`find_id` = `finds`.`id` AND w.`deleted_at` IS NULL ORDER BY w.`weighed_at` DESC, w.`id` DESC LIMIT 1);
--> statement-breakpoint
-- Finds so far are figured with their claim's (preset) fineness, or the club's off-claim.
UPDATE `finds` SET `fineness_used` = c.`fineness`, `fineness_used_low` = c.`fineness_low`, `fineness_used_high` = c.`fineness_high`, `fineness_used_basis` = 'claim_fineness' FROM `claims` c WHERE c.`id` = `finds`.`claim_id`;
--> statement-breakpoint
UPDATE `finds` SET `fineness_used` = 825, `fineness_used_low` = 700, `fineness_used_high` = 950, `fineness_used_basis` = 'club_fineness' WHERE `claim_id` IS NULL;
--> statement-breakpoint
DROP INDEX IF EXISTS `finds_ledger`;
--> statement-breakpoint
ALTER TABLE `finds` DROP COLUMN `latest_fine_grams`;
--> statement-breakpoint
ALTER TABLE `finds` DROP COLUMN `latest_fine_low`;
--> statement-breakpoint
ALTER TABLE `finds` DROP COLUMN `latest_fine_high`;
--> statement-breakpoint
ALTER TABLE `finds` ADD `latest_fine_grams` real GENERATED ALWAYS AS (case
  when assay_fine is not null then assay_fine
  when weighed_fine is not null then weighed_fine
  when kind = 'specimen' or weight_grams is null then null
  when purity is not null then weight_grams * purity / 1000.0
  else weight_grams * fineness_used / 1000.0 end) VIRTUAL;
--> statement-breakpoint
ALTER TABLE `finds` ADD `latest_fine_low` real GENERATED ALWAYS AS (case
  when assay_fine is not null then assay_low
  when weighed_fine is not null then weighed_low
  when kind = 'specimen' or weight_grams is null then null
  when purity is not null then weight_grams * purity / 1000.0
  else weight_grams * fineness_used_low / 1000.0 end) VIRTUAL;
--> statement-breakpoint
ALTER TABLE `finds` ADD `latest_fine_high` real GENERATED ALWAYS AS (case
  when assay_fine is not null then assay_high
  when weighed_fine is not null then weighed_high
  when kind = 'specimen' or weight_grams is null then null
  when purity is not null then weight_grams * purity / 1000.0
  else weight_grams * fineness_used_high / 1000.0 end) VIRTUAL;
--> statement-breakpoint
ALTER TABLE `finds` ADD `fine_basis` text GENERATED ALWAYS AS (case
  when assay_fine is not null then 'assay'
  when weighed_fine is not null then 'weighed'
  when kind = 'specimen' or weight_grams is null then null
  when purity is not null then 'recorded_purity'
  else fineness_used_basis end) VIRTUAL;
--> statement-breakpoint
ALTER TABLE `finds` ADD `weigh_mismatch` integer GENERATED ALWAYS AS (coalesce(weighed_air is not null and weight_grams is not null and abs(weighed_air - weight_grams) > max(0.1 * weight_grams, 0.05), 0)) VIRTUAL;
--> statement-breakpoint
CREATE INDEX `finds_ledger` ON `finds` (`found_at`,`deleted_at`,`claim_id`,`member_id`,`kind`,`review_state`,`weight_grams`,`latest_fine_grams`);
