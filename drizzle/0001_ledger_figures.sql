ALTER TABLE `finds` ADD `latest_alloy_grams` real;--> statement-breakpoint
ALTER TABLE `finds` ADD `latest_fine_grams` real;--> statement-breakpoint
ALTER TABLE `finds` ADD `latest_fine_low` real;--> statement-breakpoint
ALTER TABLE `finds` ADD `latest_fine_high` real;--> statement-breakpoint
ALTER TABLE `finds` ADD `review_state` text DEFAULT 'new' NOT NULL;--> statement-breakpoint
CREATE INDEX `finds_ledger` ON `finds` (`found_at`,`deleted_at`,`claim_id`,`member_id`,`kind`,`review_state`,`weight_grams`,`latest_fine_grams`);--> statement-breakpoint
UPDATE `finds` SET
  `latest_alloy_grams` = (SELECT w.gold_alloy_grams FROM weigh_ins w WHERE w.find_id = finds.id AND w.deleted_at IS NULL ORDER BY w.weighed_at DESC, w.id DESC LIMIT 1),
  `latest_fine_grams` = (SELECT w.fine_gold_grams FROM weigh_ins w WHERE w.find_id = finds.id AND w.deleted_at IS NULL ORDER BY w.weighed_at DESC, w.id DESC LIMIT 1),
  `latest_fine_low` = (SELECT json_extract(w.server_estimate, '$.range.fineGoldGrams[0]') FROM weigh_ins w WHERE w.find_id = finds.id AND w.deleted_at IS NULL ORDER BY w.weighed_at DESC, w.id DESC LIMIT 1),
  `latest_fine_high` = (SELECT json_extract(w.server_estimate, '$.range.fineGoldGrams[1]') FROM weigh_ins w WHERE w.find_id = finds.id AND w.deleted_at IS NULL ORDER BY w.weighed_at DESC, w.id DESC LIMIT 1),
  `review_state` = coalesce((SELECT CASE r.action WHEN 'verify' THEN 'verified' ELSE 'queried' END FROM reviews r WHERE r.find_id = finds.id AND r.action IN ('verify','query') ORDER BY r.created_at DESC, r.seq DESC LIMIT 1), 'new');
