-- The figure's columns become plain columns kept by triggers (an index on a generated column is read through the table).
DROP INDEX IF EXISTS `finds_ledger`;
--> statement-breakpoint
ALTER TABLE `finds` DROP COLUMN `fine_basis`;
--> statement-breakpoint
ALTER TABLE `finds` DROP COLUMN `latest_fine_grams`;
--> statement-breakpoint
ALTER TABLE `finds` DROP COLUMN `latest_fine_low`;
--> statement-breakpoint
ALTER TABLE `finds` DROP COLUMN `latest_fine_high`;
--> statement-breakpoint
ALTER TABLE `finds` DROP COLUMN `weigh_mismatch`;
--> statement-breakpoint
ALTER TABLE `finds` ADD `fine_basis` text;
--> statement-breakpoint
ALTER TABLE `finds` ADD `latest_fine_grams` real;
--> statement-breakpoint
ALTER TABLE `finds` ADD `latest_fine_low` real;
--> statement-breakpoint
ALTER TABLE `finds` ADD `latest_fine_high` real;
--> statement-breakpoint
ALTER TABLE `finds` ADD `weigh_mismatch` integer DEFAULT false NOT NULL;
--> statement-breakpoint
CREATE TRIGGER finds_figure_insert AFTER INSERT ON finds BEGIN UPDATE finds SET fine_basis = case when assay_fine is not null then 'assay' when weighed_fine is not null then 'weighed' when kind = 'specimen' or weight_grams is null then null when purity is not null then 'recorded_purity' else fineness_used_basis end, latest_fine_grams = case when assay_fine is not null then assay_fine when weighed_fine is not null then weighed_fine when kind = 'specimen' or weight_grams is null then null when purity is not null then weight_grams * purity / 1000.0 else weight_grams * fineness_used / 1000.0 end, latest_fine_low = case when assay_fine is not null then assay_low when weighed_fine is not null then weighed_low when kind = 'specimen' or weight_grams is null then null when purity is not null then weight_grams * purity / 1000.0 else weight_grams * fineness_used_low / 1000.0 end, latest_fine_high = case when assay_fine is not null then assay_high when weighed_fine is not null then weighed_high when kind = 'specimen' or weight_grams is null then null when purity is not null then weight_grams * purity / 1000.0 else weight_grams * fineness_used_high / 1000.0 end, weigh_mismatch = coalesce(weighed_air is not null and weight_grams is not null and abs(weighed_air - weight_grams) > max(0.1 * weight_grams, 0.05), 0) WHERE rowid = NEW.rowid; END;
--> statement-breakpoint
CREATE TRIGGER finds_figure_update AFTER UPDATE OF kind, weight_grams, purity, weighed_fine, weighed_low, weighed_high, weighed_air, assay_fine, assay_low, assay_high, fineness_used, fineness_used_low, fineness_used_high, fineness_used_basis ON finds BEGIN UPDATE finds SET fine_basis = case when assay_fine is not null then 'assay' when weighed_fine is not null then 'weighed' when kind = 'specimen' or weight_grams is null then null when purity is not null then 'recorded_purity' else fineness_used_basis end, latest_fine_grams = case when assay_fine is not null then assay_fine when weighed_fine is not null then weighed_fine when kind = 'specimen' or weight_grams is null then null when purity is not null then weight_grams * purity / 1000.0 else weight_grams * fineness_used / 1000.0 end, latest_fine_low = case when assay_fine is not null then assay_low when weighed_fine is not null then weighed_low when kind = 'specimen' or weight_grams is null then null when purity is not null then weight_grams * purity / 1000.0 else weight_grams * fineness_used_low / 1000.0 end, latest_fine_high = case when assay_fine is not null then assay_high when weighed_fine is not null then weighed_high when kind = 'specimen' or weight_grams is null then null when purity is not null then weight_grams * purity / 1000.0 else weight_grams * fineness_used_high / 1000.0 end, weigh_mismatch = coalesce(weighed_air is not null and weight_grams is not null and abs(weighed_air - weight_grams) > max(0.1 * weight_grams, 0.05), 0) WHERE rowid = NEW.rowid; END;
--> statement-breakpoint
UPDATE finds SET fine_basis = case when assay_fine is not null then 'assay' when weighed_fine is not null then 'weighed' when kind = 'specimen' or weight_grams is null then null when purity is not null then 'recorded_purity' else fineness_used_basis end, latest_fine_grams = case when assay_fine is not null then assay_fine when weighed_fine is not null then weighed_fine when kind = 'specimen' or weight_grams is null then null when purity is not null then weight_grams * purity / 1000.0 else weight_grams * fineness_used / 1000.0 end, latest_fine_low = case when assay_fine is not null then assay_low when weighed_fine is not null then weighed_low when kind = 'specimen' or weight_grams is null then null when purity is not null then weight_grams * purity / 1000.0 else weight_grams * fineness_used_low / 1000.0 end, latest_fine_high = case when assay_fine is not null then assay_high when weighed_fine is not null then weighed_high when kind = 'specimen' or weight_grams is null then null when purity is not null then weight_grams * purity / 1000.0 else weight_grams * fineness_used_high / 1000.0 end, weigh_mismatch = coalesce(weighed_air is not null and weight_grams is not null and abs(weighed_air - weight_grams) > max(0.1 * weight_grams, 0.05), 0);
--> statement-breakpoint
CREATE INDEX `finds_ledger` ON `finds` (`found_at`,`deleted_at`,`claim_id`,`member_id`,`kind`,`review_state`,`weight_grams`,`latest_fine_grams`,`latest_fine_low`,`latest_fine_high`,`fine_basis`,`weigh_mismatch`);
