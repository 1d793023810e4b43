CREATE TABLE "savings_result_digests" (
	"evaluation_id" text NOT NULL,
	"row_id" text NOT NULL,
	"digest" text NOT NULL,
	CONSTRAINT "savings_result_digests_evaluation_id_row_id_pk" PRIMARY KEY("evaluation_id","row_id")
);
--> statement-breakpoint
ALTER TABLE "savings_result_digests" ADD CONSTRAINT "savings_result_digests_evaluation_id_proposal_evaluations_id_fk" FOREIGN KEY ("evaluation_id") REFERENCES "public"."proposal_evaluations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "savings_result_digests" ADD CONSTRAINT "savings_result_digests_row_id_proposal_rows_id_fk" FOREIGN KEY ("row_id") REFERENCES "public"."proposal_rows"("id") ON DELETE cascade ON UPDATE no action;