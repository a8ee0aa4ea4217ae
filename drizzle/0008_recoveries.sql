CREATE TABLE `recoveries` (
	`id` text PRIMARY KEY NOT NULL,
	`kind` text NOT NULL,
	`claim_id` text,
	`recorded_on` text NOT NULL,
	`fine_grams` real NOT NULL,
	`fineness` real,
	`estimated_grams` real NOT NULL,
	`gross_grams` real NOT NULL,
	`placer_grams` real NOT NULL,
	`document_key` text,
	`document_type` text,
	`document_name` text,
	`note` text DEFAULT '' NOT NULL,
	`recorded_by` text,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`claim_id`) REFERENCES `claims`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`recorded_by`) REFERENCES `members`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `recoveries_claim` ON `recoveries` (`claim_id`,`recorded_on`);--> statement-breakpoint
CREATE TABLE `recovery_finds` (
	`recovery_id` text NOT NULL,
	`find_id` text NOT NULL,
	`estimated_grams` real,
	`allocated_grams` real NOT NULL,
	PRIMARY KEY(`recovery_id`, `find_id`),
	FOREIGN KEY (`recovery_id`) REFERENCES `recoveries`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`find_id`) REFERENCES `finds`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `recovery_finds_find` ON `recovery_finds` (`find_id`);