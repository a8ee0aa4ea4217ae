CREATE TABLE `club_settings` (
	`id` integer PRIMARY KEY NOT NULL,
	`name` text DEFAULT 'Our prospecting club' NOT NULL,
	`currency` text DEFAULT 'USD' NOT NULL,
	`time_zone` text DEFAULT 'UTC' NOT NULL,
	`updated_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL
);
--> statement-breakpoint
ALTER TABLE `reference_prices` ADD `withdrawn_at` integer;--> statement-breakpoint
ALTER TABLE `reference_prices` ADD `withdrawn_by` text REFERENCES members(id);--> statement-breakpoint
ALTER TABLE `reference_prices` ADD `replaces` text;--> statement-breakpoint
ALTER TABLE `reference_prices` ADD `note` text DEFAULT '' NOT NULL;--> statement-breakpoint
-- The club's one row, in the currency its prices were mostly kept in so far.
INSERT INTO `club_settings` (`id`, `currency`) VALUES (1, coalesce((SELECT `currency` FROM `reference_prices` GROUP BY `currency` ORDER BY count(*) DESC LIMIT 1), 'USD'));
