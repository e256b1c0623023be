CREATE TABLE "flown_confirmation" (
	"plan_version_id" uuid PRIMARY KEY NOT NULL,
	"team_id" text NOT NULL,
	"check_id" uuid NOT NULL,
	"confirmed_by" text,
	"confirmed_at" timestamp with time zone DEFAULT now() NOT NULL,
	"reasons" jsonb
);
--> statement-breakpoint
CREATE TABLE "team_setting" (
	"team_id" text PRIMARY KEY NOT NULL,
	"require_flown_confirmation" boolean DEFAULT false NOT NULL,
	"updated_by" text,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "flown_confirmation" ADD CONSTRAINT "flown_confirmation_plan_version_id_plan_version_id_fk" FOREIGN KEY ("plan_version_id") REFERENCES "public"."plan_version"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "flown_confirmation" ADD CONSTRAINT "flown_confirmation_team_id_organization_id_fk" FOREIGN KEY ("team_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "flown_confirmation" ADD CONSTRAINT "flown_confirmation_check_id_as_flown_check_id_fk" FOREIGN KEY ("check_id") REFERENCES "public"."as_flown_check"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "flown_confirmation" ADD CONSTRAINT "flown_confirmation_confirmed_by_user_id_fk" FOREIGN KEY ("confirmed_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "team_setting" ADD CONSTRAINT "team_setting_team_id_organization_id_fk" FOREIGN KEY ("team_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "team_setting" ADD CONSTRAINT "team_setting_updated_by_user_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;