-- Full-text index over each design's title, summary and the notes of the revision it shows.
-- Kept in sync by src/lib/server/search.ts whenever a design or its shown revision changes.
CREATE VIRTUAL TABLE `design_search` USING fts5(
	`design_id` UNINDEXED,
	`title`,
	`summary`,
	`notes`,
	tokenize = 'unicode61 remove_diacritics 2'
);
