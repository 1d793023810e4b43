CREATE TABLE "approach_volumes" (
	"approach_id" text NOT NULL,
	"period_id" text NOT NULL,
	"volume_veh_per_hour" double precision NOT NULL,
	"cross_volume_veh_per_hour" double precision NOT NULL,
	CONSTRAINT "approach_volumes_approach_id_period_id_pk" PRIMARY KEY("approach_id","period_id")
);
--> statement-breakpoint
CREATE TABLE "corridor_approaches" (
	"id" text PRIMARY KEY NOT NULL,
	"corridor_id" text NOT NULL,
	"intersection_id" text NOT NULL,
	"distance_m" double precision NOT NULL,
	"snap_offset_m" double precision,
	"lanes" integer NOT NULL,
	"saturation_flow_veh_per_hour_per_lane" double precision DEFAULT 1800 NOT NULL,
	"speed_limit_kmh" double precision NOT NULL,
	"jam_density_veh_per_km_per_lane" double precision DEFAULT 133 NOT NULL,
	"cross_lanes" integer NOT NULL,
	"cross_saturation_flow_veh_per_hour_per_lane" double precision DEFAULT 1800 NOT NULL,
	"stop_relation" text DEFAULT 'none' NOT NULL,
	"stop_id" text,
	"dwell_s" double precision,
	"check_in_distance_m" double precision DEFAULT 150 NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"updated_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "corridor_periods" (
	"id" text PRIMARY KEY NOT NULL,
	"corridor_id" text NOT NULL,
	"name" text NOT NULL,
	"start_time" text NOT NULL,
	"end_time" text NOT NULL,
	"sort_order" integer NOT NULL
);
--> statement-breakpoint
CREATE TABLE "corridor_stops" (
	"corridor_id" text NOT NULL,
	"seq" integer NOT NULL,
	"stop_id" text NOT NULL,
	"name" text NOT NULL,
	"lat" double precision NOT NULL,
	"lon" double precision NOT NULL,
	"distance_m" double precision NOT NULL,
	"offset_m" double precision NOT NULL,
	CONSTRAINT "corridor_stops_corridor_id_seq_pk" PRIMARY KEY("corridor_id","seq")
);
--> statement-breakpoint
CREATE TABLE "corridors" (
	"id" text PRIMARY KEY NOT NULL,
	"agency_id" text NOT NULL,
	"feed_version_id" integer NOT NULL,
	"name" text NOT NULL,
	"route_ids" text[] NOT NULL,
	"direction_id" smallint NOT NULL,
	"shape_id" text NOT NULL,
	"length_m" double precision NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "approach_volumes" ADD CONSTRAINT "approach_volumes_approach_id_corridor_approaches_id_fk" FOREIGN KEY ("approach_id") REFERENCES "public"."corridor_approaches"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "approach_volumes" ADD CONSTRAINT "approach_volumes_period_id_corridor_periods_id_fk" FOREIGN KEY ("period_id") REFERENCES "public"."corridor_periods"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corridor_approaches" ADD CONSTRAINT "corridor_approaches_corridor_id_corridors_id_fk" FOREIGN KEY ("corridor_id") REFERENCES "public"."corridors"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corridor_approaches" ADD CONSTRAINT "corridor_approaches_intersection_id_intersections_id_fk" FOREIGN KEY ("intersection_id") REFERENCES "public"."intersections"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corridor_approaches" ADD CONSTRAINT "corridor_approaches_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corridor_periods" ADD CONSTRAINT "corridor_periods_corridor_id_corridors_id_fk" FOREIGN KEY ("corridor_id") REFERENCES "public"."corridors"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corridor_stops" ADD CONSTRAINT "corridor_stops_corridor_id_corridors_id_fk" FOREIGN KEY ("corridor_id") REFERENCES "public"."corridors"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corridors" ADD CONSTRAINT "corridors_agency_id_organisations_id_fk" FOREIGN KEY ("agency_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corridors" ADD CONSTRAINT "corridors_feed_version_id_feed_versions_id_fk" FOREIGN KEY ("feed_version_id") REFERENCES "public"."feed_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corridors" ADD CONSTRAINT "corridors_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "corridor_approaches_corridor_intersection_uq" ON "corridor_approaches" USING btree ("corridor_id","intersection_id");--> statement-breakpoint
CREATE INDEX "corridor_approaches_intersection_idx" ON "corridor_approaches" USING btree ("intersection_id");--> statement-breakpoint
CREATE INDEX "corridor_periods_corridor_idx" ON "corridor_periods" USING btree ("corridor_id");--> statement-breakpoint
CREATE INDEX "corridors_feed_idx" ON "corridors" USING btree ("feed_version_id");