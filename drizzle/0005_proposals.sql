CREATE TABLE "proposal_evaluations" (
	"id" text PRIMARY KEY NOT NULL,
	"proposal_id" text NOT NULL,
	"kind" text NOT NULL,
	"row_id" text,
	"proposal_version" integer NOT NULL,
	"state" text DEFAULT 'running' NOT NULL,
	"job_id" text,
	"feed_version_id" integer,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"finished_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "proposal_results" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "proposal_results_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"evaluation_id" text NOT NULL,
	"proposal_id" text NOT NULL,
	"row_id" text NOT NULL,
	"row_version" integer NOT NULL,
	"proposal_version" integer NOT NULL,
	"variant" text NOT NULL,
	"settings" jsonb NOT NULL,
	"period_id" text NOT NULL,
	"period_name" text NOT NULL,
	"start_time" text NOT NULL,
	"end_time" text NOT NULL,
	"day_type" text NOT NULL,
	"trips_per_day" double precision NOT NULL,
	"timing_plan_id" text,
	"timing_plan_name" text,
	"timing_plan_version" integer,
	"approach_version" integer,
	"intersection_version" integer,
	"cycle_s" double precision,
	"bus_delay_baseline_s" double precision,
	"bus_delay_priority_s" double precision,
	"saving_per_trip_s" double precision,
	"daily_bus_hours_saved" double precision,
	"grant_share" double precision,
	"cross_extra_delay_per_veh_s" double precision,
	"vc_before" double precision,
	"vc_after" double precision,
	"los_before" text,
	"los_after" text,
	"person_delay_balance_s" double precision,
	"error" text,
	"model_input" jsonb,
	"model_output" jsonb
);
--> statement-breakpoint
CREATE TABLE "proposal_row_events" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "proposal_row_events_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"row_id" text NOT NULL,
	"proposal_id" text NOT NULL,
	"row_version" integer NOT NULL,
	"kind" text NOT NULL,
	"status_from" text,
	"status_to" text NOT NULL,
	"actor_id" text,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	"changes" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"comment" text DEFAULT '' NOT NULL,
	"counter" jsonb
);
--> statement-breakpoint
CREATE TABLE "proposal_rows" (
	"id" text PRIMARY KEY NOT NULL,
	"proposal_id" text NOT NULL,
	"approach_id" text,
	"intersection_id" text NOT NULL,
	"position" integer NOT NULL,
	"strategy" text NOT NULL,
	"max_extension_s" double precision NOT NULL,
	"max_early_green_s" double precision NOT NULL,
	"lockout_cycles" integer NOT NULL,
	"only_late_buses" boolean NOT NULL,
	"late_threshold_s" double precision NOT NULL,
	"late_share" double precision NOT NULL,
	"status" text DEFAULT 'draft' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"counter" jsonb,
	"last_comment" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_by" text
);
--> statement-breakpoint
CREATE TABLE "proposals" (
	"id" text PRIMARY KEY NOT NULL,
	"corridor_id" text NOT NULL,
	"name" text NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"status" text DEFAULT 'draft' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"submitted_at" timestamp with time zone,
	"submitted_by" text
);
--> statement-breakpoint
ALTER TABLE "proposal_evaluations" ADD CONSTRAINT "proposal_evaluations_proposal_id_proposals_id_fk" FOREIGN KEY ("proposal_id") REFERENCES "public"."proposals"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proposal_evaluations" ADD CONSTRAINT "proposal_evaluations_row_id_proposal_rows_id_fk" FOREIGN KEY ("row_id") REFERENCES "public"."proposal_rows"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proposal_evaluations" ADD CONSTRAINT "proposal_evaluations_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proposal_evaluations" ADD CONSTRAINT "proposal_evaluations_feed_version_id_feed_versions_id_fk" FOREIGN KEY ("feed_version_id") REFERENCES "public"."feed_versions"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proposal_evaluations" ADD CONSTRAINT "proposal_evaluations_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proposal_results" ADD CONSTRAINT "proposal_results_evaluation_id_proposal_evaluations_id_fk" FOREIGN KEY ("evaluation_id") REFERENCES "public"."proposal_evaluations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proposal_results" ADD CONSTRAINT "proposal_results_proposal_id_proposals_id_fk" FOREIGN KEY ("proposal_id") REFERENCES "public"."proposals"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proposal_results" ADD CONSTRAINT "proposal_results_row_id_proposal_rows_id_fk" FOREIGN KEY ("row_id") REFERENCES "public"."proposal_rows"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proposal_row_events" ADD CONSTRAINT "proposal_row_events_row_id_proposal_rows_id_fk" FOREIGN KEY ("row_id") REFERENCES "public"."proposal_rows"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proposal_row_events" ADD CONSTRAINT "proposal_row_events_proposal_id_proposals_id_fk" FOREIGN KEY ("proposal_id") REFERENCES "public"."proposals"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proposal_row_events" ADD CONSTRAINT "proposal_row_events_actor_id_users_id_fk" FOREIGN KEY ("actor_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proposal_rows" ADD CONSTRAINT "proposal_rows_proposal_id_proposals_id_fk" FOREIGN KEY ("proposal_id") REFERENCES "public"."proposals"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proposal_rows" ADD CONSTRAINT "proposal_rows_approach_id_corridor_approaches_id_fk" FOREIGN KEY ("approach_id") REFERENCES "public"."corridor_approaches"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proposal_rows" ADD CONSTRAINT "proposal_rows_intersection_id_intersections_id_fk" FOREIGN KEY ("intersection_id") REFERENCES "public"."intersections"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proposal_rows" ADD CONSTRAINT "proposal_rows_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proposals" ADD CONSTRAINT "proposals_corridor_id_corridors_id_fk" FOREIGN KEY ("corridor_id") REFERENCES "public"."corridors"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proposals" ADD CONSTRAINT "proposals_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proposals" ADD CONSTRAINT "proposals_submitted_by_users_id_fk" FOREIGN KEY ("submitted_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "proposal_evaluations_proposal_idx" ON "proposal_evaluations" USING btree ("proposal_id","kind","created_at");--> statement-breakpoint
CREATE INDEX "proposal_results_evaluation_idx" ON "proposal_results" USING btree ("evaluation_id");--> statement-breakpoint
CREATE INDEX "proposal_results_row_idx" ON "proposal_results" USING btree ("row_id","variant");--> statement-breakpoint
CREATE INDEX "proposal_row_events_row_idx" ON "proposal_row_events" USING btree ("row_id","id");--> statement-breakpoint
CREATE INDEX "proposal_rows_proposal_idx" ON "proposal_rows" USING btree ("proposal_id");--> statement-breakpoint
CREATE INDEX "proposal_rows_intersection_idx" ON "proposal_rows" USING btree ("intersection_id");--> statement-breakpoint
CREATE INDEX "proposals_corridor_idx" ON "proposals" USING btree ("corridor_id");