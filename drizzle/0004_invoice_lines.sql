ALTER TABLE `invoice` ADD `lines` text DEFAULT '[]' NOT NULL;--> statement-breakpoint
ALTER TABLE `invoice` ADD `corrects_id` text REFERENCES invoice(id);--> statement-breakpoint
ALTER TABLE `invoice` ADD `estimate_id` text REFERENCES invoice(id);--> statement-breakpoint
ALTER TABLE `invoice` ADD `is_credit_note` integer DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE `invoice` ADD `bill_to` text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE `invoice` ADD `created_by_id` text REFERENCES user(id);--> statement-breakpoint
ALTER TABLE `invoice` ADD `voided_at` integer;--> statement-breakpoint
ALTER TABLE `payment` ADD `payment_intent_id` text;--> statement-breakpoint
ALTER TABLE `payment` ADD `payer_email` text;--> statement-breakpoint
ALTER TABLE `payment` ADD `refund_id` text;--> statement-breakpoint
ALTER TABLE `payment` ADD `refunded_at` integer;--> statement-breakpoint
ALTER TABLE `payment` ADD `refunded_minor` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `payment` ADD `flag` text;