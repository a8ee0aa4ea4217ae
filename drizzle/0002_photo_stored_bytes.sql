CREATE TABLE `photo_bytes_to_delete` (
	`storage_key` text PRIMARY KEY NOT NULL,
	`since` integer NOT NULL
);
--> statement-breakpoint
ALTER TABLE `photos` ADD `stored_bytes` integer;--> statement-breakpoint
-- Photos uploaded before this column: the record's size is the best figure there is.
UPDATE `photos` SET `stored_bytes` = `bytes` WHERE `storage_key` IS NOT NULL;
