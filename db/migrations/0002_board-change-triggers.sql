-- The production board's change counter: every insert, delete and board-relevant update of
-- requests, orders and organisations raises it (db/schema/change-counters.ts).
INSERT OR IGNORE INTO `change_counters` (`name`, `n`) VALUES ('board', 0);
--> statement-breakpoint
CREATE TRIGGER `board_changed_on_requests_insert` AFTER INSERT ON `requests` BEGIN UPDATE `change_counters` SET `n` = `n` + 1 WHERE `name` = 'board'; END;
--> statement-breakpoint
CREATE TRIGGER `board_changed_on_requests_delete` AFTER DELETE ON `requests` BEGIN UPDATE `change_counters` SET `n` = `n` + 1 WHERE `name` = 'board'; END;
--> statement-breakpoint
CREATE TRIGGER `board_changed_on_requests_update` AFTER UPDATE OF `stage`, `reference`, `project_name`, `held_from_stage`, `is_controlled`, `updated_at`, `org_id` ON `requests` BEGIN UPDATE `change_counters` SET `n` = `n` + 1 WHERE `name` = 'board'; END;
--> statement-breakpoint
CREATE TRIGGER `board_changed_on_orders_insert` AFTER INSERT ON `orders` BEGIN UPDATE `change_counters` SET `n` = `n` + 1 WHERE `name` = 'board'; END;
--> statement-breakpoint
CREATE TRIGGER `board_changed_on_orders_delete` AFTER DELETE ON `orders` BEGIN UPDATE `change_counters` SET `n` = `n` + 1 WHERE `name` = 'board'; END;
--> statement-breakpoint
CREATE TRIGGER `board_changed_on_orders_update` AFTER UPDATE OF `request_id`, `org_id`, `planned_start`, `planned_ship` ON `orders` BEGIN UPDATE `change_counters` SET `n` = `n` + 1 WHERE `name` = 'board'; END;
--> statement-breakpoint
CREATE TRIGGER `board_changed_on_organisations_insert` AFTER INSERT ON `organisations` BEGIN UPDATE `change_counters` SET `n` = `n` + 1 WHERE `name` = 'board'; END;
--> statement-breakpoint
CREATE TRIGGER `board_changed_on_organisations_delete` AFTER DELETE ON `organisations` BEGIN UPDATE `change_counters` SET `n` = `n` + 1 WHERE `name` = 'board'; END;
--> statement-breakpoint
CREATE TRIGGER `board_changed_on_organisations_update` AFTER UPDATE OF `name` ON `organisations` BEGIN UPDATE `change_counters` SET `n` = `n` + 1 WHERE `name` = 'board'; END;
