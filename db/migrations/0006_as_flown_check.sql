CREATE TABLE "as_flown_check" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"team_id" text NOT NULL,
	"plan_version_id" uuid NOT NULL,
	"source" text NOT NULL,
	"label" text NOT NULL,
	"photo_count" integer NOT NULL,
	"photos" jsonb NOT NULL,
	"document" jsonb NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "as_flown_check" ADD CONSTRAINT "as_flown_check_team_id_organization_id_fk" FOREIGN KEY ("team_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "as_flown_check" ADD CONSTRAINT "as_flown_check_plan_version_id_plan_version_id_fk" FOREIGN KEY ("plan_version_id") REFERENCES "public"."plan_version"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "as_flown_check" ADD CONSTRAINT "as_flown_check_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "as_flown_check_version_idx" ON "as_flown_check" USING btree ("team_id","plan_version_id","created_at");