PRAGMA foreign_keys=OFF;--> statement-breakpoint
CREATE TABLE `__new_invoice` (
	`id` text PRIMARY KEY NOT NULL,
	`cruise_id` text NOT NULL,
	`number` text,
	`kind` text NOT NULL,
	`description` text NOT NULL,
	`amount_minor` integer NOT NULL,
	`currency` text NOT NULL,
	`status` text DEFAULT 'draft' NOT NULL,
	`issued_at` integer,
	`due_at` integer,
	`paid_at` integer,
	`created_at` integer DEFAULT (cast(unixepoch('subsec') * 1000 as integer)) NOT NULL,
	`lines` text DEFAULT '[]' NOT NULL,
	`corrects_id` text,
	`estimate_id` text,
	`is_credit_note` integer DEFAULT false NOT NULL,
	`bill_to` text DEFAULT '' NOT NULL,
	`created_by_id` text,
	`voided_at` integer,
	FOREIGN KEY (`cruise_id`) REFERENCES `cruise`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`corrects_id`) REFERENCES `invoice`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`estimate_id`) REFERENCES `invoice`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`created_by_id`) REFERENCES `user`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
INSERT INTO `__new_invoice`("id", "cruise_id", "number", "kind", "description", "amount_minor", "currency", "status", "issued_at", "due_at", "paid_at", "created_at", "lines", "corrects_id", "estimate_id", "is_credit_note", "bill_to", "created_by_id", "voided_at") SELECT "id", "cruise_id", "number", "kind", "description", "amount_minor", "currency", "status", "issued_at", "due_at", "paid_at", "created_at", "lines", "corrects_id", "estimate_id", "is_credit_note", "bill_to", "created_by_id", "voided_at" FROM `invoice`;--> statement-breakpoint
DROP TABLE `invoice`;--> statement-breakpoint
ALTER TABLE `__new_invoice` RENAME TO `invoice`;--> statement-breakpoint
PRAGMA foreign_keys=ON;--> statement-breakpoint
CREATE UNIQUE INDEX `invoice_number_unique` ON `invoice` (`number`);