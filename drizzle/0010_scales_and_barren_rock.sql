CREATE TABLE `barren_rocks` (
	`id` text PRIMARY KEY NOT NULL,
	`member_id` text NOT NULL,
	`claim_id` text NOT NULL,
	`input` text NOT NULL,
	`device_density` real,
	`density` real NOT NULL,
	`scale_id` text,
	`scale_check` text,
	`scale_check_passed` integer,
	`notes` text DEFAULT '' NOT NULL,
	`weighed_at` integer NOT NULL,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	`updated_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	`deleted_at` integer,
	`seq` integer DEFAULT 0 NOT NULL,
	FOREIGN KEY (`member_id`) REFERENCES `members`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`claim_id`) REFERENCES `claims`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `barren_rocks_claim` ON `barren_rocks` (`claim_id`,`weighed_at`);--> statement-breakpoint
CREATE INDEX `barren_rocks_member_seq` ON `barren_rocks` (`member_id`,`seq`);--> statement-breakpoint
CREATE INDEX `barren_rocks_seq` ON `barren_rocks` (`seq`);--> statement-breakpoint
CREATE TABLE `scales` (
	`id` text PRIMARY KEY NOT NULL,
	`member_id` text NOT NULL,
	`name` text NOT NULL,
	`step_grams` real NOT NULL,
	`accuracy_grams` real,
	`checks` text NOT NULL,
	`latest_check_passed` integer,
	`latest_checked_at` integer,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	`updated_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	`deleted_at` integer,
	`seq` integer DEFAULT 0 NOT NULL,
	FOREIGN KEY (`member_id`) REFERENCES `members`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `scales_member_seq` ON `scales` (`member_id`,`seq`);--> statement-breakpoint
CREATE INDEX `scales_seq` ON `scales` (`seq`);--> statement-breakpoint
ALTER TABLE `finds` ADD `weighed_scale_checked` integer;--> statement-breakpoint
ALTER TABLE `weigh_ins` ADD `scale_id` text;--> statement-breakpoint
ALTER TABLE `weigh_ins` ADD `scale_check` text;--> statement-breakpoint
ALTER TABLE `weigh_ins` ADD `scale_check_passed` integer;--> statement-breakpoint
-- Finds weighed before scale profiles existed were weighed on no named scale: not checked.
UPDATE `finds` SET `weighed_scale_checked` = 0 WHERE `latest_alloy_grams` IS NOT NULL;
