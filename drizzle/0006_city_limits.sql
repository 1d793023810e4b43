CREATE TABLE "city_limits" (
	"org_id" text PRIMARY KEY NOT NULL,
	"max_cross_vc" double precision,
	"worst_los" text,
	"max_extension_s" double precision,
	"max_early_green_s" double precision,
	"min_lockout_cycles" integer DEFAULT 0 NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_by" text
);
--> statement-breakpoint
ALTER TABLE "city_limits" ADD CONSTRAINT "city_limits_org_id_organisations_id_fk" FOREIGN KEY ("org_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "city_limits" ADD CONSTRAINT "city_limits_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;