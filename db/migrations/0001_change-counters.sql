CREATE TABLE `change_counters` (
	`name` text PRIMARY KEY NOT NULL,
	`n` integer DEFAULT 0 NOT NULL
);
