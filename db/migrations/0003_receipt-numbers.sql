ALTER TABLE `payments` ADD `receipt_number` text;--> statement-breakpoint
CREATE UNIQUE INDEX `payments_receipt_number_uq` ON `payments` (`receipt_number`);--> statement-breakpoint
UPDATE `payments` SET `receipt_number` = (
  SELECT 'RC-' || n.y || '-' || printf('%05d', n.rn) FROM (
    SELECT `id`, strftime('%Y', `paid_at` / 1000, 'unixepoch') AS y,
      row_number() OVER (PARTITION BY strftime('%Y', `paid_at` / 1000, 'unixepoch') ORDER BY `paid_at`, `id`) AS rn
    FROM `payments` WHERE `paid_at` IS NOT NULL AND `status` IN ('paid', 'refunded', 'partially_refunded')
  ) AS n WHERE n.`id` = `payments`.`id`
) WHERE `paid_at` IS NOT NULL AND `status` IN ('paid', 'refunded', 'partially_refunded');
