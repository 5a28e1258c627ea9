CREATE TABLE `maintenance_blocks` (
	`id` text PRIMARY KEY NOT NULL,
	`resource_key` text NOT NULL,
	`starts_at` integer NOT NULL,
	`ends_at` integer NOT NULL,
	`reason` text NOT NULL,
	`created_by_id` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `maintenance_blocks_resource_idx` ON `maintenance_blocks` (`resource_key`,`starts_at`);--> statement-breakpoint
CREATE TABLE `ship_date_changes` (
	`id` text PRIMARY KEY NOT NULL,
	`order_id` text NOT NULL,
	`from_date` integer,
	`to_date` integer NOT NULL,
	`reason` text NOT NULL,
	`is_notified` integer DEFAULT false NOT NULL,
	`actor_id` text,
	`at` integer NOT NULL,
	FOREIGN KEY (`order_id`) REFERENCES `orders`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`actor_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `ship_date_changes_order_idx` ON `ship_date_changes` (`order_id`,`at`);--> statement-breakpoint
ALTER TABLE `requests` ADD `lead_time` text DEFAULT 'standard' NOT NULL;--> statement-breakpoint
ALTER TABLE `quotes` ADD `lead_time` text DEFAULT 'standard' NOT NULL;