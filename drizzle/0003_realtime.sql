CREATE TABLE "realtime_snapshots" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "realtime_snapshots_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"feed_version_id" integer NOT NULL,
	"source_id" text,
	"file_name" text NOT NULL,
	"header_time" timestamp with time zone NOT NULL,
	"content_hash" text NOT NULL,
	"gtfs_realtime_version" text NOT NULL,
	"bytes" integer NOT NULL,
	"entity_count" integer NOT NULL,
	"vehicle_count" integer NOT NULL,
	"trip_update_count" integer NOT NULL,
	"other_count" integer NOT NULL,
	"unmatched_count" integer NOT NULL,
	"unmatched_sample" jsonb NOT NULL,
	"uploaded_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "realtime_sources" (
	"id" text PRIMARY KEY NOT NULL,
	"organisation_id" text NOT NULL,
	"feed_version_id" integer NOT NULL,
	"name" text NOT NULL,
	"url" text NOT NULL,
	"interval_s" integer NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"last_polled_at" timestamp with time zone,
	"last_outcome" text,
	"last_message" text DEFAULT '' NOT NULL,
	"poll_count" integer DEFAULT 0 NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "realtime_stop_time_observations" (
	"snapshot_id" integer NOT NULL,
	"feed_version_id" integer NOT NULL,
	"trip_id" text NOT NULL,
	"service_date" date NOT NULL,
	"stop_sequence" integer NOT NULL,
	"stop_id" text NOT NULL,
	"reported_s" bigint NOT NULL,
	"arrival_s" bigint,
	"departure_s" bigint,
	"delay_s" integer NOT NULL
);
--> statement-breakpoint
CREATE TABLE "realtime_vehicle_observations" (
	"snapshot_id" integer NOT NULL,
	"feed_version_id" integer NOT NULL,
	"trip_id" text NOT NULL,
	"service_date" date NOT NULL,
	"start_time" text,
	"vehicle_id" text,
	"observed_s" bigint NOT NULL,
	"lat" double precision NOT NULL,
	"lon" double precision NOT NULL,
	"bearing" real,
	"speed_mps" real,
	"status" smallint NOT NULL,
	"stop_id" text,
	"stop_sequence" integer
);
--> statement-breakpoint
ALTER TABLE "realtime_snapshots" ADD CONSTRAINT "realtime_snapshots_feed_version_id_feed_versions_id_fk" FOREIGN KEY ("feed_version_id") REFERENCES "public"."feed_versions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "realtime_snapshots" ADD CONSTRAINT "realtime_snapshots_source_id_realtime_sources_id_fk" FOREIGN KEY ("source_id") REFERENCES "public"."realtime_sources"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "realtime_snapshots" ADD CONSTRAINT "realtime_snapshots_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "realtime_sources" ADD CONSTRAINT "realtime_sources_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "realtime_sources" ADD CONSTRAINT "realtime_sources_feed_version_id_feed_versions_id_fk" FOREIGN KEY ("feed_version_id") REFERENCES "public"."feed_versions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "realtime_sources" ADD CONSTRAINT "realtime_sources_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "realtime_stop_time_observations" ADD CONSTRAINT "realtime_stop_time_observations_snapshot_id_realtime_snapshots_id_fk" FOREIGN KEY ("snapshot_id") REFERENCES "public"."realtime_snapshots"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "realtime_vehicle_observations" ADD CONSTRAINT "realtime_vehicle_observations_snapshot_id_realtime_snapshots_id_fk" FOREIGN KEY ("snapshot_id") REFERENCES "public"."realtime_snapshots"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "realtime_snapshots_dedupe_uq" ON "realtime_snapshots" USING btree ("feed_version_id","header_time","content_hash");--> statement-breakpoint
CREATE INDEX "realtime_snapshots_time_idx" ON "realtime_snapshots" USING btree ("feed_version_id","header_time");--> statement-breakpoint
CREATE INDEX "realtime_sources_organisation_idx" ON "realtime_sources" USING btree ("organisation_id");--> statement-breakpoint
CREATE INDEX "realtime_stop_obs_trip_idx" ON "realtime_stop_time_observations" USING btree ("feed_version_id","service_date","trip_id","stop_sequence");--> statement-breakpoint
CREATE INDEX "realtime_stop_obs_snapshot_idx" ON "realtime_stop_time_observations" USING btree ("snapshot_id");--> statement-breakpoint
CREATE INDEX "realtime_vehicle_obs_trip_idx" ON "realtime_vehicle_observations" USING btree ("feed_version_id","service_date","trip_id","observed_s");--> statement-breakpoint
CREATE INDEX "realtime_vehicle_obs_snapshot_idx" ON "realtime_vehicle_observations" USING btree ("snapshot_id");