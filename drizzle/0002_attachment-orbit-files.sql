CREATE TABLE "attachment_orbit_files" (
	"attachment_id" uuid PRIMARY KEY NOT NULL,
	"board_id" uuid NOT NULL,
	"sha256" text NOT NULL,
	"status" text NOT NULL,
	"format" text,
	"parsed" jsonb,
	"summaries" jsonb,
	"error_line" integer,
	"error" text,
	"parsed_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "attachment_orbit_files" ADD CONSTRAINT "attachment_orbit_files_attachment_id_attachments_id_fk" FOREIGN KEY ("attachment_id") REFERENCES "public"."attachments"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "attachment_orbit_files" ADD CONSTRAINT "attachment_orbit_files_board_id_boards_id_fk" FOREIGN KEY ("board_id") REFERENCES "public"."boards"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "attachment_orbit_files_board_idx" ON "attachment_orbit_files" USING btree ("board_id");