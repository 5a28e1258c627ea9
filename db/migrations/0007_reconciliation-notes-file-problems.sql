CREATE TABLE `reconciliation_notes` (
	`id` text PRIMARY KEY NOT NULL,
	`finding_key` text NOT NULL,
	`note` text NOT NULL,
	`is_resolved` integer DEFAULT false NOT NULL,
	`author_id` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`author_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `reconciliation_notes_key_idx` ON `reconciliation_notes` (`finding_key`,`created_at`);--> statement-breakpoint
ALTER TABLE `parts` ADD `file_problem` text;