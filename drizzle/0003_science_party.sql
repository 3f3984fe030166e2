CREATE TABLE `document_requirement` (
	`cruise_id` text NOT NULL,
	`kind` text NOT NULL,
	`days_before_sailing` integer NOT NULL,
	FOREIGN KEY (`cruise_id`) REFERENCES `cruise`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `document_requirement_pk` ON `document_requirement` (`cruise_id`,`kind`);--> statement-breakpoint
CREATE TABLE `travel_profile` (
	`user_id` text PRIMARY KEY NOT NULL,
	`full_name` text NOT NULL,
	`nationality` text NOT NULL,
	`date_of_birth` text NOT NULL,
	`passport_number` text NOT NULL,
	`passport_expiry` text NOT NULL,
	`updated_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
ALTER TABLE `berth_application` ADD `institution` text;--> statement-breakpoint
ALTER TABLE `berth_application` ADD `waitlist_position` integer;--> statement-breakpoint
ALTER TABLE `berth_application` ADD `decision_message` text;--> statement-breakpoint
ALTER TABLE `document` ADD `status` text DEFAULT 'uploaded' NOT NULL;--> statement-breakpoint
ALTER TABLE `document` ADD `expires_on` text;--> statement-breakpoint
ALTER TABLE `document` ADD `review_reason` text;--> statement-breakpoint
ALTER TABLE `document` ADD `reviewed_by_id` text REFERENCES user(id);--> statement-breakpoint
ALTER TABLE `document` ADD `reviewed_at` integer;--> statement-breakpoint
CREATE INDEX `document_cruise_user_idx` ON `document` (`cruise_id`,`user_id`,`kind`);--> statement-breakpoint
ALTER TABLE `leg` ADD `science_berths` integer;