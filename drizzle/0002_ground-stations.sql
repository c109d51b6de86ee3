CREATE TABLE "ground_stations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"board_id" uuid NOT NULL,
	"name" text NOT NULL,
	"latitude" double precision NOT NULL,
	"longitude" double precision NOT NULL,
	"altitude" double precision DEFAULT 0 NOT NULL,
	"minimum_elevation" double precision NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "ground_stations" ADD CONSTRAINT "ground_stations_board_id_boards_id_fk" FOREIGN KEY ("board_id") REFERENCES "public"."boards"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "ground_stations_board_name_key" ON "ground_stations" USING btree ("board_id","name");--> statement-breakpoint
CREATE INDEX "ground_stations_board_idx" ON "ground_stations" USING btree ("board_id");