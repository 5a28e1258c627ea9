DROP INDEX `requests_org_idx`;--> statement-breakpoint
CREATE INDEX `requests_org_creator_idx` ON `requests` (`org_id`,`created_by_id`,`updated_at`,`id`);--> statement-breakpoint
CREATE INDEX `requests_org_stage_idx` ON `requests` (`org_id`,`stage`,`updated_at`,`id`);--> statement-breakpoint
CREATE INDEX `requests_org_reference_idx` ON `requests` (`org_id`,`reference`);--> statement-breakpoint
CREATE INDEX `requests_org_project_idx` ON `requests` (`org_id`,`project_name`,`id`);--> statement-breakpoint
CREATE INDEX `requests_org_needed_idx` ON `requests` (`org_id`,`needed_by`,`id`);--> statement-breakpoint
CREATE INDEX `requests_org_idx` ON `requests` (`org_id`,`updated_at`,`id`);