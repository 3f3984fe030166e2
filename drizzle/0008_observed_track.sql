CREATE TABLE `observed_track` (
	`id` text PRIMARY KEY NOT NULL,
	`cruise_id` text NOT NULL,
	`name` text NOT NULL,
	`format` text NOT NULL,
	`points` integer NOT NULL,
	`fixes` blob NOT NULL,
	`warnings` text,
	`depths_flipped` integer DEFAULT false NOT NULL,
	`sha256` text NOT NULL,
	`created_by_id` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`cruise_id`) REFERENCES `cruise`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `observed_track_cruise_idx` ON `observed_track` (`cruise_id`,`created_at`);--> statement-breakpoint
CREATE UNIQUE INDEX `observed_track_file_idx` ON `observed_track` (`cruise_id`,`sha256`);