ALTER TABLE `claims` ADD `landowner` text;--> statement-breakpoint
ALTER TABLE `claims` ADD `royalty_kind` text;--> statement-breakpoint
ALTER TABLE `claims` ADD `royalty_rate` real;