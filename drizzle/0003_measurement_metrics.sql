ALTER TABLE `measurements` ADD `metrics` text;--> statement-breakpoint
-- Listings read metrics only: parsing each sweep's whole analysis (about 34 kB of JSON) on every
-- design page view was the largest part of that page's database time. Derived from analysis.
UPDATE `measurements` SET `metrics` = json_remove(`analysis`, '$.series');
--> statement-breakpoint
CREATE TRIGGER `measurements_metrics_on_insert` AFTER INSERT ON `measurements` BEGIN
	UPDATE measurements SET metrics = json_remove(NEW.analysis, '$.series') WHERE id = NEW.id;
END;
--> statement-breakpoint
CREATE TRIGGER `measurements_metrics_on_update` AFTER UPDATE OF `analysis` ON `measurements` BEGIN
	UPDATE measurements SET metrics = json_remove(NEW.analysis, '$.series') WHERE id = NEW.id;
END;
