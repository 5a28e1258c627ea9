CREATE TABLE `document_series` (
	`series` text NOT NULL,
	`year` integer NOT NULL,
	`last_number` integer DEFAULT 0 NOT NULL,
	PRIMARY KEY(`series`, `year`)
);
--> statement-breakpoint
CREATE TABLE `issued_documents` (
	`id` text PRIMARY KEY NOT NULL,
	`request_id` text NOT NULL,
	`org_id` text NOT NULL,
	`kind` text NOT NULL,
	`series` text NOT NULL,
	`year` integer NOT NULL,
	`seq` integer NOT NULL,
	`number` text NOT NULL,
	`source_id` text NOT NULL,
	`data` text NOT NULL,
	`pdf` blob,
	`pdf_sha256` text,
	`issued_by_id` text,
	`issued_at` integer NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`request_id`) REFERENCES `requests`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`org_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`issued_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `issued_documents_number_uq` ON `issued_documents` (`number`);--> statement-breakpoint
CREATE UNIQUE INDEX `issued_documents_series_seq_uq` ON `issued_documents` (`series`,`year`,`seq`);--> statement-breakpoint
CREATE UNIQUE INDEX `issued_documents_source_uq` ON `issued_documents` (`kind`,`source_id`);--> statement-breakpoint
CREATE INDEX `issued_documents_request_idx` ON `issued_documents` (`request_id`,`issued_at`);--> statement-breakpoint
CREATE TABLE `terms_of_sale` (
	`id` text PRIMARY KEY NOT NULL,
	`version` integer NOT NULL,
	`is_current` integer DEFAULT true NOT NULL,
	`title` text NOT NULL,
	`body` text NOT NULL,
	`created_by_id` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `terms_of_sale_version_uq` ON `terms_of_sale` (`version`);--> statement-breakpoint
ALTER TABLE `quotes` ADD `terms_version` integer;--> statement-breakpoint
ALTER TABLE `orders` ADD `terms_version` integer;--> statement-breakpoint
ALTER TABLE `email_jobs` ADD `attachments` text;--> statement-breakpoint
ALTER TABLE `email_outbox` ADD `attachments` text;