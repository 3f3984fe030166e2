CREATE TABLE `notice_preference` (
	`user_id` text NOT NULL,
	`kind` text NOT NULL,
	`enabled` integer NOT NULL,
	`updated_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `notice_preference_pk` ON `notice_preference` (`user_id`,`kind`);--> statement-breakpoint
CREATE TABLE `schedule_version` (
	`id` text PRIMARY KEY NOT NULL,
	`cruise_id` text NOT NULL,
	`version` integer NOT NULL,
	`published_by_id` text,
	`published_at` integer NOT NULL,
	`snapshot` text NOT NULL,
	`changes` text NOT NULL,
	`recipient_count` integer DEFAULT 0 NOT NULL,
	FOREIGN KEY (`cruise_id`) REFERENCES `cruise`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`published_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `schedule_version_pk` ON `schedule_version` (`cruise_id`,`version`);--> statement-breakpoint
CREATE TABLE `unsubscribe_token` (
	`id` text PRIMARY KEY NOT NULL,
	`token_hash` text NOT NULL,
	`user_id` text NOT NULL,
	`kind` text NOT NULL,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	`used_at` integer,
	FOREIGN KEY (`user_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `unsubscribe_token_tokenHash_unique` ON `unsubscribe_token` (`token_hash`);--> statement-breakpoint
ALTER TABLE `notice` ADD `user_id` text;--> statement-breakpoint
ALTER TABLE `notice` ADD `dedupe_key` text;--> statement-breakpoint
ALTER TABLE `notice` ADD `headers` text;--> statement-breakpoint
CREATE UNIQUE INDEX `notice_dedupeKey_unique` ON `notice` (`dedupe_key`);--> statement-breakpoint
CREATE INDEX `notice_cruise_idx` ON `notice` (`cruise_id`,`created_at`);