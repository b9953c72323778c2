ALTER TABLE `designs` ADD `listed_revision_id` text;--> statement-breakpoint
ALTER TABLE `designs` ADD `listed_lo_hz` real;--> statement-breakpoint
ALTER TABLE `designs` ADD `listed_hi_hz` real;--> statement-breakpoint
ALTER TABLE `designs` ADD `build_reports` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `designs` ADD `search_rowid` integer;--> statement-breakpoint
CREATE UNIQUE INDEX `designs_search_rowid_unique` ON `designs` (`search_rowid`);--> statement-breakpoint
CREATE INDEX `designs_reports_idx` ON `designs` (`build_reports`,`created_at`);--> statement-breakpoint
-- Listing columns are derived data, kept by triggers so that every write path (app, seed, scripts)
-- leaves them right. The listed revision is the shown (approved) one, else the newest submitted.
CREATE VIEW `design_listed_revision` AS
SELECT d.id AS design_id,
	coalesce(d.shown_revision_id, (SELECT r.id FROM revisions r WHERE r.design_id = d.id AND r.state IN ('submitted', 'approved') ORDER BY r.number DESC LIMIT 1)) AS revision_id
FROM designs d;
--> statement-breakpoint
CREATE TRIGGER `designs_listed_claim` AFTER UPDATE OF `listed_revision_id` ON `designs` BEGIN
	UPDATE designs SET
		listed_lo_hz = (SELECT claim_lo_hz FROM revisions WHERE id = NEW.listed_revision_id),
		listed_hi_hz = (SELECT claim_hi_hz FROM revisions WHERE id = NEW.listed_revision_id)
	WHERE id = NEW.id;
END;
--> statement-breakpoint
CREATE TRIGGER `designs_listed_on_shown` AFTER UPDATE OF `shown_revision_id` ON `designs` BEGIN
	UPDATE designs SET listed_revision_id = (SELECT revision_id FROM design_listed_revision WHERE design_id = NEW.id) WHERE id = NEW.id;
END;
--> statement-breakpoint
CREATE TRIGGER `designs_listed_on_revision_insert` AFTER INSERT ON `revisions` BEGIN
	UPDATE designs SET listed_revision_id = (SELECT revision_id FROM design_listed_revision WHERE design_id = NEW.design_id) WHERE id = NEW.design_id;
END;
--> statement-breakpoint
CREATE TRIGGER `designs_listed_on_revision_state` AFTER UPDATE OF `state` ON `revisions` BEGIN
	UPDATE designs SET listed_revision_id = (SELECT revision_id FROM design_listed_revision WHERE design_id = NEW.design_id) WHERE id = NEW.design_id;
END;
--> statement-breakpoint
CREATE TRIGGER `designs_listed_on_revision_delete` AFTER DELETE ON `revisions` BEGIN
	UPDATE designs SET listed_revision_id = (SELECT revision_id FROM design_listed_revision WHERE design_id = OLD.design_id) WHERE id = OLD.design_id;
END;
--> statement-breakpoint
CREATE VIEW `design_build_reports` AS
SELECT r.design_id AS design_id, count(*) AS n
FROM measurements m JOIN revisions r ON r.id = m.revision_id
WHERE m.kind = 'build_report'
GROUP BY r.design_id;
--> statement-breakpoint
CREATE TRIGGER `designs_reports_on_insert` AFTER INSERT ON `measurements` WHEN NEW.kind = 'build_report' BEGIN
	UPDATE designs SET build_reports = coalesce((SELECT n FROM design_build_reports WHERE design_id = designs.id), 0)
	WHERE id = (SELECT design_id FROM revisions WHERE id = NEW.revision_id);
END;
--> statement-breakpoint
CREATE TRIGGER `designs_reports_on_delete` AFTER DELETE ON `measurements` WHEN OLD.kind = 'build_report' BEGIN
	UPDATE designs SET build_reports = coalesce((SELECT n FROM design_build_reports WHERE design_id = designs.id), 0)
	WHERE id = (SELECT design_id FROM revisions WHERE id = OLD.revision_id);
END;
--> statement-breakpoint
CREATE TRIGGER `designs_reports_on_update` AFTER UPDATE OF `kind`, `revision_id` ON `measurements` BEGIN
	UPDATE designs SET build_reports = coalesce((SELECT n FROM design_build_reports WHERE design_id = designs.id), 0)
	WHERE id IN ((SELECT design_id FROM revisions WHERE id = OLD.revision_id), (SELECT design_id FROM revisions WHERE id = NEW.revision_id));
END;
--> statement-breakpoint
-- search_rowid: the design's stable row id in design_search (a table's own rowid may change on VACUUM).
CREATE TRIGGER `designs_search_rowid` AFTER INSERT ON `designs` BEGIN
	UPDATE designs SET search_rowid = (SELECT coalesce(max(search_rowid), 0) + 1 FROM designs) WHERE id = NEW.id;
END;
--> statement-breakpoint
UPDATE `designs` SET
	`search_rowid` = rowid,
	`listed_revision_id` = (SELECT revision_id FROM design_listed_revision WHERE design_id = designs.id),
	`build_reports` = coalesce((SELECT n FROM design_build_reports WHERE design_id = designs.id), 0);
--> statement-breakpoint
-- The index keyed by search_rowid, so a hit joins its design by an integer, without reading text.
CREATE VIRTUAL TABLE `design_search_v2` USING fts5(
	`title`,
	`summary`,
	`notes`,
	tokenize = 'unicode61 remove_diacritics 2'
);
--> statement-breakpoint
INSERT INTO `design_search_v2` (rowid, title, summary, notes)
SELECT d.search_rowid, s.title, s.summary, s.notes FROM design_search s JOIN designs d ON d.id = s.design_id;
--> statement-breakpoint
DROP TABLE `design_search`;
--> statement-breakpoint
ALTER TABLE `design_search_v2` RENAME TO `design_search`;
--> statement-breakpoint
CREATE TRIGGER `designs_search_on_delete` AFTER DELETE ON `designs` BEGIN
	DELETE FROM design_search WHERE rowid = OLD.search_rowid;
END;
