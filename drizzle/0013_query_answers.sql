CREATE TABLE `answers` (
	`id` text PRIMARY KEY NOT NULL,
	`member_id` text NOT NULL,
	`find_id` text NOT NULL,
	`review_id` text NOT NULL,
	`note` text NOT NULL,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	`updated_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	`deleted_at` integer,
	`seq` integer DEFAULT 0 NOT NULL,
	FOREIGN KEY (`member_id`) REFERENCES `members`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`find_id`) REFERENCES `finds`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`review_id`) REFERENCES `reviews`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `answers_find` ON `answers` (`find_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `answers_review` ON `answers` (`review_id`);--> statement-breakpoint
CREATE INDEX `answers_member_seq` ON `answers` (`member_id`,`seq`);--> statement-breakpoint
CREATE INDEX `answers_seq` ON `answers` (`seq`);--> statement-breakpoint
ALTER TABLE `members` ADD `mail_on_query` integer DEFAULT false NOT NULL;