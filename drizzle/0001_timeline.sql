CREATE TABLE `calendar_entry` (
	`cruise_id` text NOT NULL,
	`key` text NOT NULL,
	`digest` text NOT NULL,
	`sequence` integer DEFAULT 0 NOT NULL,
	`updated_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`cruise_id`) REFERENCES `cruise`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `calendar_entry_pk` ON `calendar_entry` (`cruise_id`,`key`);--> statement-breakpoint
CREATE TABLE `clearance_item` (
	`clearance_id` text NOT NULL,
	`plan_item_id` text NOT NULL,
	FOREIGN KEY (`clearance_id`) REFERENCES `clearance`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`plan_item_id`) REFERENCES `plan_item`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `clearance_item_pk` ON `clearance_item` (`clearance_id`,`plan_item_id`);--> statement-breakpoint
CREATE TABLE `clock_change` (
	`id` text PRIMARY KEY NOT NULL,
	`cruise_id` text NOT NULL,
	`at` integer NOT NULL,
	`utc_offset_minutes` integer NOT NULL,
	`note` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`cruise_id`) REFERENCES `cruise`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `clock_change_cruise_idx` ON `clock_change` (`cruise_id`,`at`);--> statement-breakpoint
CREATE TABLE `deadline` (
	`id` text PRIMARY KEY NOT NULL,
	`cruise_id` text NOT NULL,
	`title` text NOT NULL,
	`kind` text DEFAULT 'other' NOT NULL,
	`anchor` text DEFAULT 'sailing' NOT NULL,
	`offset_days` integer NOT NULL,
	`done_at` integer,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`cruise_id`) REFERENCES `cruise`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `deadline_cruise_idx` ON `deadline` (`cruise_id`);--> statement-breakpoint
ALTER TABLE `cruise` ADD `weather_margin_days` real;--> statement-breakpoint
ALTER TABLE `cruise` ADD `turn_h` real DEFAULT 0.5 NOT NULL;--> statement-breakpoint
ALTER TABLE `cruise` ADD `mobilisation_h` real DEFAULT 24 NOT NULL;--> statement-breakpoint
ALTER TABLE `cruise` ADD `demobilisation_h` real DEFAULT 12 NOT NULL;