CREATE TABLE "flight_trigger" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"team_id" text NOT NULL,
	"plan_version_id" uuid NOT NULL,
	"sortie" uuid NOT NULL,
	"image_index" integer NOT NULL,
	"lat" double precision NOT NULL,
	"lon" double precision NOT NULL,
	"altitude_above_takeoff_m" double precision NOT NULL,
	"altitude_msl_m" double precision NOT NULL,
	"roll_deg" double precision NOT NULL,
	"pitch_deg" double precision NOT NULL,
	"yaw_deg" double precision NOT NULL,
	"captured_at" timestamp with time zone NOT NULL,
	"recorded_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "flight_trigger" ADD CONSTRAINT "flight_trigger_team_id_organization_id_fk" FOREIGN KEY ("team_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "flight_trigger" ADD CONSTRAINT "flight_trigger_plan_version_id_plan_version_id_fk" FOREIGN KEY ("plan_version_id") REFERENCES "public"."plan_version"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "flight_trigger" ADD CONSTRAINT "flight_trigger_recorded_by_user_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "flight_trigger_photo_uq" ON "flight_trigger" USING btree ("plan_version_id","sortie","image_index");--> statement-breakpoint
CREATE INDEX "flight_trigger_team_idx" ON "flight_trigger" USING btree ("team_id","plan_version_id");