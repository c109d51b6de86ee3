CREATE INDEX "check_results_version_status_idx" ON "check_results" USING btree ("version_id","status");--> statement-breakpoint
CREATE INDEX "proposals_board_updated_idx" ON "proposals" USING btree ("board_id","updated_at","id");--> statement-breakpoint
CREATE INDEX "proposals_board_created_idx" ON "proposals" USING btree ("board_id","created_at","id");--> statement-breakpoint
CREATE INDEX "proposals_board_title_idx" ON "proposals" USING btree ("board_id","title","id");--> statement-breakpoint
CREATE INDEX "proposals_board_status_idx" ON "proposals" USING btree ("board_id","status","id");--> statement-breakpoint
CREATE INDEX "proposals_board_version_idx" ON "proposals" USING btree ("board_id","latest_version","id");--> statement-breakpoint
CREATE INDEX "proposals_board_call_updated_idx" ON "proposals" USING btree ("board_id","call_id","updated_at","id");--> statement-breakpoint
CREATE INDEX "review_items_version_status_idx" ON "review_items" USING btree ("version_id","status","severity");