-- Every change to a market's sales bumps markets.sales_revision in the same transaction,
-- so a cached fit is current exactly when its revision matches (any process, any writer).
CREATE TRIGGER `sales_revision_after_insert` AFTER INSERT ON `sales`
BEGIN
  UPDATE `markets` SET `sales_revision` = `sales_revision` + 1 WHERE `id` = NEW.`market_id`;
END;
--> statement-breakpoint
CREATE TRIGGER `sales_revision_after_update` AFTER UPDATE ON `sales`
BEGIN
  UPDATE `markets` SET `sales_revision` = `sales_revision` + 1 WHERE `id` = NEW.`market_id` OR `id` = OLD.`market_id`;
END;
--> statement-breakpoint
CREATE TRIGGER `sales_revision_after_delete` AFTER DELETE ON `sales`
BEGIN
  UPDATE `markets` SET `sales_revision` = `sales_revision` + 1 WHERE `id` = OLD.`market_id`;
END;
