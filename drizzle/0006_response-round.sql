CREATE TABLE "response_windows" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"board_id" uuid NOT NULL,
	"call_id" uuid NOT NULL,
	"opens_at" timestamp with time zone NOT NULL,
	"closes_at" timestamp with time zone NOT NULL,
	"opened_by" uuid,
	"opening_mailed_at" timestamp with time zone,
	"reminder_mailed_at" timestamp with time zone,
	"closing_mailed_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "review_item_answers" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"board_id" uuid NOT NULL,
	"review_item_id" uuid NOT NULL,
	"window_id" uuid NOT NULL,
	"author_id" uuid NOT NULL,
	"body" text NOT NULL,
	"section_version_id" uuid,
	"section_heading" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "review_item_dispositions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"board_id" uuid NOT NULL,
	"review_item_id" uuid NOT NULL,
	"disposition" text NOT NULL,
	"reason" text DEFAULT '' NOT NULL,
	"actor_id" uuid,
	"actor_role" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "reviews" ADD COLUMN "confidence" text;--> statement-breakpoint
ALTER TABLE "reviews" ADD COLUMN "expertise" text;--> statement-breakpoint
ALTER TABLE "response_windows" ADD CONSTRAINT "response_windows_board_id_boards_id_fk" FOREIGN KEY ("board_id") REFERENCES "public"."boards"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "response_windows" ADD CONSTRAINT "response_windows_call_id_calls_id_fk" FOREIGN KEY ("call_id") REFERENCES "public"."calls"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "response_windows" ADD CONSTRAINT "response_windows_opened_by_users_id_fk" FOREIGN KEY ("opened_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_item_answers" ADD CONSTRAINT "review_item_answers_board_id_boards_id_fk" FOREIGN KEY ("board_id") REFERENCES "public"."boards"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_item_answers" ADD CONSTRAINT "review_item_answers_review_item_id_review_items_id_fk" FOREIGN KEY ("review_item_id") REFERENCES "public"."review_items"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_item_answers" ADD CONSTRAINT "review_item_answers_window_id_response_windows_id_fk" FOREIGN KEY ("window_id") REFERENCES "public"."response_windows"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_item_answers" ADD CONSTRAINT "review_item_answers_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_item_answers" ADD CONSTRAINT "review_item_answers_section_version_id_proposal_versions_id_fk" FOREIGN KEY ("section_version_id") REFERENCES "public"."proposal_versions"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_item_dispositions" ADD CONSTRAINT "review_item_dispositions_board_id_boards_id_fk" FOREIGN KEY ("board_id") REFERENCES "public"."boards"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_item_dispositions" ADD CONSTRAINT "review_item_dispositions_review_item_id_review_items_id_fk" FOREIGN KEY ("review_item_id") REFERENCES "public"."review_items"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_item_dispositions" ADD CONSTRAINT "review_item_dispositions_actor_id_users_id_fk" FOREIGN KEY ("actor_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "response_windows_call_key" ON "response_windows" USING btree ("call_id");--> statement-breakpoint
CREATE INDEX "response_windows_board_idx" ON "response_windows" USING btree ("board_id");--> statement-breakpoint
CREATE UNIQUE INDEX "review_item_answers_item_key" ON "review_item_answers" USING btree ("review_item_id");--> statement-breakpoint
CREATE INDEX "review_item_answers_board_idx" ON "review_item_answers" USING btree ("board_id");--> statement-breakpoint
CREATE INDEX "review_item_dispositions_item_idx" ON "review_item_dispositions" USING btree ("review_item_id","created_at");