CREATE TABLE `transfer_funds` (
	`id` text PRIMARY KEY NOT NULL,
	`processor_id` text NOT NULL,
	`processor_customer_id` text NOT NULL,
	`org_id` text,
	`payment_id` text,
	`amount_cents` integer NOT NULL,
	`currency` text DEFAULT 'usd' NOT NULL,
	`reference` text,
	`applied_cents` integer DEFAULT 0 NOT NULL,
	`status` text NOT NULL,
	`received_at` integer NOT NULL,
	`resolved_at` integer,
	`resolved_by_id` text,
	`resolution` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`org_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`payment_id`) REFERENCES `payments`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`resolved_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `transfer_funds_processor_uq` ON `transfer_funds` (`processor_id`);--> statement-breakpoint
CREATE INDEX `transfer_funds_org_idx` ON `transfer_funds` (`org_id`);--> statement-breakpoint
CREATE INDEX `transfer_funds_status_idx` ON `transfer_funds` (`status`);--> statement-breakpoint
CREATE TABLE `addresses` (
	`id` text PRIMARY KEY NOT NULL,
	`org_id` text NOT NULL,
	`kind` text NOT NULL,
	`label` text NOT NULL,
	`attention` text,
	`line1` text NOT NULL,
	`line2` text,
	`city` text NOT NULL,
	`region` text,
	`postal_code` text NOT NULL,
	`country` text NOT NULL,
	`phone` text,
	`delivery_notes` text,
	`is_default` integer DEFAULT false NOT NULL,
	`archived_at` integer,
	`created_by_id` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`org_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `addresses_org_idx` ON `addresses` (`org_id`,`kind`);--> statement-breakpoint
CREATE TABLE `tax_exemptions` (
	`id` text PRIMARY KEY NOT NULL,
	`org_id` text NOT NULL,
	`certificate_number` text NOT NULL,
	`issued_by` text NOT NULL,
	`expires_on` integer NOT NULL,
	`upload_id` text,
	`status` text DEFAULT 'pending' NOT NULL,
	`review_note` text,
	`reviewed_by_id` text,
	`reviewed_at` integer,
	`uploaded_by_id` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`org_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`upload_id`) REFERENCES `uploads`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`reviewed_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`uploaded_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `tax_exemptions_org_idx` ON `tax_exemptions` (`org_id`,`status`);--> statement-breakpoint
ALTER TABLE `organisations` ADD `payment_terms` text DEFAULT 'prepay' NOT NULL;--> statement-breakpoint
ALTER TABLE `organisations` ADD `credit_limit_cents` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `organisations` ADD `terms_approved_by_id` text REFERENCES users(id);--> statement-breakpoint
ALTER TABLE `organisations` ADD `terms_approved_at` integer;--> statement-breakpoint
ALTER TABLE `organisations` ADD `processor_customer_id` text;--> statement-breakpoint
ALTER TABLE `orders` ADD `payment_terms` text DEFAULT 'prepay' NOT NULL;--> statement-breakpoint
ALTER TABLE `orders` ADD `po_upload_id` text;--> statement-breakpoint
ALTER TABLE `orders` ADD `ship_to` text;--> statement-breakpoint
ALTER TABLE `orders` ADD `bill_to` text;--> statement-breakpoint
ALTER TABLE `orders` ADD `lines` text;--> statement-breakpoint
ALTER TABLE `orders` ADD `subtotal_cents` integer;--> statement-breakpoint
ALTER TABLE `orders` ADD `margin_cents` integer;--> statement-breakpoint
ALTER TABLE `orders` ADD `tax_bp` integer;--> statement-breakpoint
ALTER TABLE `orders` ADD `tax_cents` integer;--> statement-breakpoint
ALTER TABLE `orders` ADD `tax_exemption` text;--> statement-breakpoint
ALTER TABLE `orders` ADD `invoiced_at` integer;--> statement-breakpoint
ALTER TABLE `orders` ADD `due_at` integer;--> statement-breakpoint
ALTER TABLE `orders` ADD `reminder_sent_at` integer;--> statement-breakpoint
ALTER TABLE `orders` ADD `overdue_notice_at` integer;--> statement-breakpoint
ALTER TABLE `payments` ADD `method` text DEFAULT 'card' NOT NULL;--> statement-breakpoint
ALTER TABLE `payments` ADD `transfer_reference` text;--> statement-breakpoint
ALTER TABLE `payments` ADD `transfer_details` text;--> statement-breakpoint
ALTER TABLE `payments` ADD `received_cents` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `payments` ADD `external_reference` text;--> statement-breakpoint
ALTER TABLE `payments` ADD `note` text;