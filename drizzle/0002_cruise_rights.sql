ALTER TABLE `user` ADD `can_lead_cruises` integer DEFAULT false NOT NULL;--> statement-breakpoint
CREATE UNIQUE INDEX `cruise_code_ci_idx` ON `cruise` (lower("code"));