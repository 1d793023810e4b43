CREATE TABLE "intersections" (
	"id" text PRIMARY KEY NOT NULL,
	"name" text NOT NULL,
	"lat" double precision NOT NULL,
	"lon" double precision NOT NULL,
	"jurisdiction_id" text NOT NULL,
	"crossing_distance_m" double precision NOT NULL,
	"min_ped_walk_s" double precision DEFAULT 7 NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_by" text
);
--> statement-breakpoint
CREATE TABLE "timing_plans" (
	"id" text PRIMARY KEY NOT NULL,
	"intersection_id" text NOT NULL,
	"name" text NOT NULL,
	"day_types" text[] NOT NULL,
	"start_time" text NOT NULL,
	"end_time" text NOT NULL,
	"cycle_s" double precision NOT NULL,
	"bus_green_s" double precision NOT NULL,
	"yellow_s" double precision NOT NULL,
	"red_clearance_s" double precision NOT NULL,
	"cross_min_green_s" double precision NOT NULL,
	"ped_walk_s" double precision NOT NULL,
	"ped_clearance_s" double precision NOT NULL,
	"offset_s" double precision NOT NULL,
	"ped_concurrent" boolean DEFAULT true NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_by" text
);
--> statement-breakpoint
ALTER TABLE "intersections" ADD CONSTRAINT "intersections_jurisdiction_id_organisations_id_fk" FOREIGN KEY ("jurisdiction_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "intersections" ADD CONSTRAINT "intersections_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "timing_plans" ADD CONSTRAINT "timing_plans_intersection_id_intersections_id_fk" FOREIGN KEY ("intersection_id") REFERENCES "public"."intersections"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "timing_plans" ADD CONSTRAINT "timing_plans_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "intersections_jurisdiction_name_uq" ON "intersections" USING btree ("jurisdiction_id","name");--> statement-breakpoint
CREATE INDEX "intersections_jurisdiction_idx" ON "intersections" USING btree ("jurisdiction_id");--> statement-breakpoint
CREATE UNIQUE INDEX "timing_plans_intersection_name_uq" ON "timing_plans" USING btree ("intersection_id","name");