CREATE TABLE `api_token` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` text NOT NULL,
	`name` text NOT NULL,
	`token_hash` text NOT NULL,
	`prefix` text NOT NULL,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	`last_used_at` integer,
	`revoked_at` integer,
	FOREIGN KEY (`user_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `api_token_tokenHash_unique` ON `api_token` (`token_hash`);--> statement-breakpoint
CREATE INDEX `api_token_user_idx` ON `api_token` (`user_id`);--> statement-breakpoint
CREATE TABLE `audit_log` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`cruise_id` text,
	`user_id` text,
	`action` text NOT NULL,
	`detail` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`cruise_id`) REFERENCES `cruise`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `audit_cruise_idx` ON `audit_log` (`cruise_id`,`created_at`);--> statement-breakpoint
CREATE TABLE `berth_application` (
	`id` text PRIMARY KEY NOT NULL,
	`cruise_id` text NOT NULL,
	`leg_id` text NOT NULL,
	`user_id` text NOT NULL,
	`status` text DEFAULT 'applied' NOT NULL,
	`role_on_board` text,
	`note` text,
	`decided_by_id` text,
	`decided_at` integer,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`cruise_id`) REFERENCES `cruise`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`leg_id`) REFERENCES `leg`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`decided_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `berth_application_leg_user` ON `berth_application` (`leg_id`,`user_id`);--> statement-breakpoint
CREATE TABLE `clearance` (
	`id` text PRIMARY KEY NOT NULL,
	`cruise_id` text NOT NULL,
	`coastal_state` text NOT NULL,
	`lead_months` integer DEFAULT 6 NOT NULL,
	`status` text DEFAULT 'not_started' NOT NULL,
	`submitted_at` integer,
	`submitted_plan` text,
	`submitted_plan_hash` text,
	`notes` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`cruise_id`) REFERENCES `cruise`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `cruise` (
	`id` text PRIMARY KEY NOT NULL,
	`code` text NOT NULL,
	`title` text NOT NULL,
	`status` text DEFAULT 'draft' NOT NULL,
	`vessel_id` text,
	`departure_port_id` text,
	`return_port_id` text,
	`departure_at` integer,
	`return_at` integer,
	`allocated_days` real DEFAULT 0 NOT NULL,
	`weather_margin_pct` real DEFAULT 10 NOT NULL,
	`depth_model` text DEFAULT 'stein-stein-1992' NOT NULL,
	`created_by_id` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	`updated_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`vessel_id`) REFERENCES `vessel`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`departure_port_id`) REFERENCES `port`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`return_port_id`) REFERENCES `port`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `cruise_code_unique` ON `cruise` (`code`);--> statement-breakpoint
CREATE TABLE `cruise_member` (
	`cruise_id` text NOT NULL,
	`user_id` text NOT NULL,
	`role` text NOT NULL,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`cruise_id`) REFERENCES `cruise`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `cruise_member_pk` ON `cruise_member` (`cruise_id`,`user_id`);--> statement-breakpoint
CREATE TABLE `document` (
	`id` text PRIMARY KEY NOT NULL,
	`cruise_id` text NOT NULL,
	`user_id` text NOT NULL,
	`kind` text NOT NULL,
	`filename` text NOT NULL,
	`mime_type` text NOT NULL,
	`size_bytes` integer NOT NULL,
	`sha256` text NOT NULL,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`cruise_id`) REFERENCES `cruise`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `invitation` (
	`id` text PRIMARY KEY NOT NULL,
	`email` text NOT NULL,
	`name` text,
	`global_role` text DEFAULT 'member' NOT NULL,
	`cruise_id` text,
	`cruise_role` text,
	`token_hash` text NOT NULL,
	`invited_by_id` text,
	`expires_at` integer NOT NULL,
	`accepted_at` integer,
	`revoked_at` integer,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`cruise_id`) REFERENCES `cruise`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`invited_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `invitation_tokenHash_unique` ON `invitation` (`token_hash`);--> statement-breakpoint
CREATE INDEX `invitation_email_idx` ON `invitation` (`email`);--> statement-breakpoint
CREATE TABLE `invoice` (
	`id` text PRIMARY KEY NOT NULL,
	`cruise_id` text NOT NULL,
	`number` text NOT NULL,
	`kind` text NOT NULL,
	`description` text NOT NULL,
	`amount_minor` integer NOT NULL,
	`currency` text NOT NULL,
	`status` text DEFAULT 'draft' NOT NULL,
	`issued_at` integer,
	`due_at` integer,
	`paid_at` integer,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`cruise_id`) REFERENCES `cruise`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `invoice_number_unique` ON `invoice` (`number`);--> statement-breakpoint
CREATE TABLE `leg` (
	`id` text PRIMARY KEY NOT NULL,
	`cruise_id` text NOT NULL,
	`seq` integer NOT NULL,
	`name` text NOT NULL,
	`from_port_id` text,
	`to_port_id` text,
	`start_at` integer,
	`end_at` integer,
	FOREIGN KEY (`cruise_id`) REFERENCES `cruise`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`from_port_id`) REFERENCES `port`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`to_port_id`) REFERENCES `port`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `leg_seq_idx` ON `leg` (`cruise_id`,`seq`);--> statement-breakpoint
CREATE TABLE `notice` (
	`id` text PRIMARY KEY NOT NULL,
	`cruise_id` text,
	`kind` text NOT NULL,
	`to_address` text NOT NULL,
	`subject` text NOT NULL,
	`text` text NOT NULL,
	`html` text,
	`ics_attachment` text,
	`status` text DEFAULT 'queued' NOT NULL,
	`attempts` integer DEFAULT 0 NOT NULL,
	`next_attempt_at` integer NOT NULL,
	`last_error` text,
	`message_id` text,
	`sent_at` integer,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`cruise_id`) REFERENCES `cruise`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `notice_due_idx` ON `notice` (`status`,`next_attempt_at`);--> statement-breakpoint
CREATE TABLE `password_reset` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` text NOT NULL,
	`token_hash` text NOT NULL,
	`expires_at` integer NOT NULL,
	`used_at` integer,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `password_reset_tokenHash_unique` ON `password_reset` (`token_hash`);--> statement-breakpoint
CREATE TABLE `payment` (
	`id` text PRIMARY KEY NOT NULL,
	`invoice_id` text NOT NULL,
	`checkout_session_id` text NOT NULL,
	`status` text DEFAULT 'open' NOT NULL,
	`amount_minor` integer NOT NULL,
	`currency` text NOT NULL,
	`paid_by_id` text,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	`completed_at` integer,
	FOREIGN KEY (`invoice_id`) REFERENCES `invoice`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`paid_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `payment_checkoutSessionId_unique` ON `payment` (`checkout_session_id`);--> statement-breakpoint
CREATE TABLE `plan_item` (
	`id` text PRIMARY KEY NOT NULL,
	`cruise_id` text NOT NULL,
	`leg_id` text,
	`seq` integer NOT NULL,
	`kind` text NOT NULL,
	`line_id` text,
	`station_id` text,
	`port_id` text,
	`reversed` integer DEFAULT false NOT NULL,
	`port_call_hours` real,
	FOREIGN KEY (`cruise_id`) REFERENCES `cruise`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`leg_id`) REFERENCES `leg`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`line_id`) REFERENCES `survey_line`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`station_id`) REFERENCES `station`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`port_id`) REFERENCES `port`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `plan_item_cruise_idx` ON `plan_item` (`cruise_id`,`seq`);--> statement-breakpoint
CREATE TABLE `port` (
	`id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`country_code` text,
	`lon` real NOT NULL,
	`lat` real NOT NULL,
	`utc_offset_minutes` integer DEFAULT 0 NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `port_name_unique` ON `port` (`name`);--> statement-breakpoint
CREATE TABLE `ridge_segment` (
	`id` text PRIMARY KEY NOT NULL,
	`cruise_id` text NOT NULL,
	`name` text NOT NULL,
	`axis` text NOT NULL,
	`full_rate_mm_yr` real NOT NULL,
	`asymmetry` real DEFAULT 0.5 NOT NULL,
	`potential_temperature_c` real,
	`axial_depth_m` real,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`cruise_id`) REFERENCES `cruise`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `session` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` text NOT NULL,
	`expires_at` integer NOT NULL,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `session_user_idx` ON `session` (`user_id`);--> statement-breakpoint
CREATE TABLE `sign_in_throttle` (
	`key` text PRIMARY KEY NOT NULL,
	`failures` integer DEFAULT 0 NOT NULL,
	`window_started_at` integer NOT NULL,
	`locked_until` integer
);
--> statement-breakpoint
CREATE TABLE `station` (
	`id` text PRIMARY KEY NOT NULL,
	`cruise_id` text NOT NULL,
	`name` text NOT NULL,
	`kind` text NOT NULL,
	`lon` real NOT NULL,
	`lat` real NOT NULL,
	`params` text DEFAULT '{}' NOT NULL,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`cruise_id`) REFERENCES `cruise`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `survey_area` (
	`id` text PRIMARY KEY NOT NULL,
	`cruise_id` text NOT NULL,
	`name` text NOT NULL,
	`ring` text NOT NULL,
	`overlap_pct` real DEFAULT 30 NOT NULL,
	`survey_speed_kn` real DEFAULT 8 NOT NULL,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`cruise_id`) REFERENCES `cruise`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `survey_line` (
	`id` text PRIMARY KEY NOT NULL,
	`cruise_id` text NOT NULL,
	`area_id` text,
	`name` text NOT NULL,
	`coords` text NOT NULL,
	`purpose` text DEFAULT 'multibeam' NOT NULL,
	`survey_speed_kn` real DEFAULT 8 NOT NULL,
	`overlap_pct` real DEFAULT 30 NOT NULL,
	`iho_order` text DEFAULT '2' NOT NULL,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	FOREIGN KEY (`cruise_id`) REFERENCES `cruise`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`area_id`) REFERENCES `survey_area`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE TABLE `user` (
	`id` text PRIMARY KEY NOT NULL,
	`email` text NOT NULL,
	`name` text NOT NULL,
	`password_hash` text,
	`role` text DEFAULT 'member' NOT NULL,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `user_email_unique` ON `user` (`email`);--> statement-breakpoint
CREATE TABLE `vessel` (
	`id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`call_sign` text NOT NULL,
	`science_berths` integer NOT NULL,
	`transit_speed_kn` real NOT NULL,
	`survey_speed_kn` real NOT NULL,
	`day_rate_minor` integer NOT NULL,
	`currency` text DEFAULT 'EUR' NOT NULL,
	`swath_angle_deg` real DEFAULT 130 NOT NULL,
	`swath_depth_factor` real DEFAULT 4 NOT NULL,
	`winch_speed_m_per_min` real DEFAULT 60 NOT NULL,
	`endurance_days` integer NOT NULL,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `vessel_callSign_unique` ON `vessel` (`call_sign`);--> statement-breakpoint
CREATE TABLE `webhook_event` (
	`id` text PRIMARY KEY NOT NULL,
	`type` text NOT NULL,
	`received_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL
);
