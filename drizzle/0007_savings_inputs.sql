CREATE TABLE "savings_inputs" (
	"id" text PRIMARY KEY NOT NULL,
	"agency_id" text NOT NULL,
	"corridor_id" text,
	"default_load" double precision NOT NULL,
	"loads" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"cost_per_revenue_hour" double precision,
	"currency" text NOT NULL,
	"cost_year" integer NOT NULL,
	"layover_share" double precision NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_by" text,
	CONSTRAINT "savings_inputs_scope_uq" UNIQUE NULLS NOT DISTINCT("agency_id","corridor_id")
);
--> statement-breakpoint
CREATE TABLE "savings_schedule_digests" (
	"corridor_id" text NOT NULL,
	"feed_version_id" integer NOT NULL,
	"fingerprint" text NOT NULL,
	"digest" text NOT NULL,
	"built_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "savings_schedule_digests_uq" UNIQUE("corridor_id","feed_version_id")
);
--> statement-breakpoint
ALTER TABLE "savings_inputs" ADD CONSTRAINT "savings_inputs_agency_id_organisations_id_fk" FOREIGN KEY ("agency_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "savings_inputs" ADD CONSTRAINT "savings_inputs_corridor_id_corridors_id_fk" FOREIGN KEY ("corridor_id") REFERENCES "public"."corridors"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "savings_inputs" ADD CONSTRAINT "savings_inputs_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "savings_schedule_digests" ADD CONSTRAINT "savings_schedule_digests_corridor_id_corridors_id_fk" FOREIGN KEY ("corridor_id") REFERENCES "public"."corridors"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "savings_schedule_digests" ADD CONSTRAINT "savings_schedule_digests_feed_version_id_feed_versions_id_fk" FOREIGN KEY ("feed_version_id") REFERENCES "public"."feed_versions"("id") ON DELETE cascade ON UPDATE no action;