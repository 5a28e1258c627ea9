CREATE TABLE `email_jobs` (
	`id` text PRIMARY KEY NOT NULL,
	`to_addresses` text NOT NULL,
	`from_address` text,
	`reply_to` text,
	`subject` text NOT NULL,
	`html` text NOT NULL,
	`text` text NOT NULL,
	`tags` text,
	`idempotency_key` text NOT NULL,
	`status` text DEFAULT 'queued' NOT NULL,
	`attempts` integer DEFAULT 0 NOT NULL,
	`next_attempt_at` integer,
	`lease_until` integer,
	`last_error` text,
	`provider_id` text,
	`created_at` integer NOT NULL,
	`sent_at` integer
);
--> statement-breakpoint
CREATE INDEX `email_jobs_status_next_idx` ON `email_jobs` (`status`,`next_attempt_at`);--> statement-breakpoint
CREATE TABLE `recovery_codes` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` text NOT NULL,
	`code_hash` text NOT NULL,
	`used_at` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `recovery_codes_user_idx` ON `recovery_codes` (`user_id`);--> statement-breakpoint
CREATE TABLE `two_factor` (
	`user_id` text PRIMARY KEY NOT NULL,
	`secret` text NOT NULL,
	`confirmed_at` integer,
	`last_used_step` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `bureau_settings` (
	`id` text PRIMARY KEY NOT NULL,
	`model_retention_days` integer DEFAULT 180 NOT NULL,
	`retention_run_on` text,
	`updated_by_id` text,
	`updated_at` integer,
	FOREIGN KEY (`updated_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `file_retention` (
	`request_id` text PRIMARY KEY NOT NULL,
	`deletion_requested_at` integer,
	`deletion_requested_by_id` text,
	`files_deleted_at` integer,
	`files_deleted_count` integer,
	FOREIGN KEY (`request_id`) REFERENCES `requests`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`deletion_requested_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
ALTER TABLE `analyses` ADD `attempts` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `analyses` ADD `lease_until` integer;--> statement-breakpoint
CREATE INDEX `analyses_status_lease_idx` ON `analyses` (`status`,`lease_until`);