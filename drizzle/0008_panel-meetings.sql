CREATE TABLE "call_rankings" (
	"call_id" uuid PRIMARY KEY NOT NULL,
	"board_id" uuid NOT NULL,
	"rank_by" text DEFAULT 'raw' NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "panel_meeting_attendance" (
	"meeting_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"present" boolean DEFAULT true NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "panel_meeting_attendance_meeting_id_user_id_pk" PRIMARY KEY("meeting_id","user_id")
);
--> statement-breakpoint
CREATE TABLE "panel_meeting_records" (
	"meeting_id" uuid NOT NULL,
	"proposal_id" uuid NOT NULL,
	"consensus_score" numeric(8, 2),
	"recommendation" text,
	"notes" text DEFAULT '' NOT NULL,
	"recorded_by" uuid,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "panel_meeting_records_meeting_id_proposal_id_pk" PRIMARY KEY("meeting_id","proposal_id")
);
--> statement-breakpoint
CREATE TABLE "panel_meetings" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"board_id" uuid NOT NULL,
	"call_id" uuid NOT NULL,
	"proposal_order" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"current_proposal_id" uuid,
	"status" text DEFAULT 'running' NOT NULL,
	"revision" integer DEFAULT 1 NOT NULL,
	"started_by" uuid,
	"started_at" timestamp with time zone DEFAULT now() NOT NULL,
	"closed_at" timestamp with time zone,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "call_rankings" ADD CONSTRAINT "call_rankings_call_id_calls_id_fk" FOREIGN KEY ("call_id") REFERENCES "public"."calls"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "call_rankings" ADD CONSTRAINT "call_rankings_board_id_boards_id_fk" FOREIGN KEY ("board_id") REFERENCES "public"."boards"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "panel_meeting_attendance" ADD CONSTRAINT "panel_meeting_attendance_meeting_id_panel_meetings_id_fk" FOREIGN KEY ("meeting_id") REFERENCES "public"."panel_meetings"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "panel_meeting_attendance" ADD CONSTRAINT "panel_meeting_attendance_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "panel_meeting_records" ADD CONSTRAINT "panel_meeting_records_meeting_id_panel_meetings_id_fk" FOREIGN KEY ("meeting_id") REFERENCES "public"."panel_meetings"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "panel_meeting_records" ADD CONSTRAINT "panel_meeting_records_proposal_id_proposals_id_fk" FOREIGN KEY ("proposal_id") REFERENCES "public"."proposals"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "panel_meeting_records" ADD CONSTRAINT "panel_meeting_records_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "panel_meetings" ADD CONSTRAINT "panel_meetings_board_id_boards_id_fk" FOREIGN KEY ("board_id") REFERENCES "public"."boards"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "panel_meetings" ADD CONSTRAINT "panel_meetings_call_id_calls_id_fk" FOREIGN KEY ("call_id") REFERENCES "public"."calls"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "panel_meetings" ADD CONSTRAINT "panel_meetings_current_proposal_id_proposals_id_fk" FOREIGN KEY ("current_proposal_id") REFERENCES "public"."proposals"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "panel_meetings" ADD CONSTRAINT "panel_meetings_started_by_users_id_fk" FOREIGN KEY ("started_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "panel_meetings_call_key" ON "panel_meetings" USING btree ("call_id");