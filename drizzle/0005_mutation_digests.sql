CREATE TABLE `sync_mutations` (
	`client_id` text NOT NULL,
	`mutation_id` integer NOT NULL,
	`digest` text NOT NULL,
	PRIMARY KEY(`client_id`, `mutation_id`),
	FOREIGN KEY (`client_id`) REFERENCES `sync_clients`(`id`) ON UPDATE no action ON DELETE no action
);
