CREATE TABLE `page_stamp` (
	`id` integer PRIMARY KEY NOT NULL,
	`stamp` integer NOT NULL
);
--> statement-breakpoint
-- Every table a public page reads moves the stamp on; sessions, tokens, mail and the audit log do not
-- (src/lib/server/page-cache.test.ts checks that each table is in one list or the other).
INSERT INTO `page_stamp` (`id`, `stamp`) VALUES (1, 0);
--> statement-breakpoint
CREATE TRIGGER `users_page_stamp_on_insert` AFTER INSERT ON `users` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `users_page_stamp_on_update` AFTER UPDATE ON `users` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `users_page_stamp_on_delete` AFTER DELETE ON `users` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `designs_page_stamp_on_insert` AFTER INSERT ON `designs` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `designs_page_stamp_on_update` AFTER UPDATE ON `designs` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `designs_page_stamp_on_delete` AFTER DELETE ON `designs` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `revisions_page_stamp_on_insert` AFTER INSERT ON `revisions` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `revisions_page_stamp_on_update` AFTER UPDATE ON `revisions` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `revisions_page_stamp_on_delete` AFTER DELETE ON `revisions` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `reviews_page_stamp_on_insert` AFTER INSERT ON `reviews` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `reviews_page_stamp_on_update` AFTER UPDATE ON `reviews` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `reviews_page_stamp_on_delete` AFTER DELETE ON `reviews` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `comments_page_stamp_on_insert` AFTER INSERT ON `comments` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `comments_page_stamp_on_update` AFTER UPDATE ON `comments` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `comments_page_stamp_on_delete` AFTER DELETE ON `comments` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `measurements_page_stamp_on_insert` AFTER INSERT ON `measurements` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `measurements_page_stamp_on_update` AFTER UPDATE ON `measurements` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `measurements_page_stamp_on_delete` AFTER DELETE ON `measurements` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `attachments_page_stamp_on_insert` AFTER INSERT ON `attachments` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `attachments_page_stamp_on_update` AFTER UPDATE ON `attachments` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `attachments_page_stamp_on_delete` AFTER DELETE ON `attachments` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `retirements_page_stamp_on_insert` AFTER INSERT ON `retirements` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `retirements_page_stamp_on_update` AFTER UPDATE ON `retirements` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
--> statement-breakpoint
CREATE TRIGGER `retirements_page_stamp_on_delete` AFTER DELETE ON `retirements` BEGIN
	UPDATE page_stamp SET stamp = stamp + 1 WHERE id = 1;
END;
