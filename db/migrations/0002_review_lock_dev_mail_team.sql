ALTER TABLE "dev_mail" ADD COLUMN "team_id" text;--> statement-breakpoint
ALTER TABLE "dev_mail" ADD CONSTRAINT "dev_mail_team_id_organization_id_fk" FOREIGN KEY ("team_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "dev_mail_team_idx" ON "dev_mail" USING btree ("team_id","received_at");--> statement-breakpoint
-- A signed-off plan version is locked: the database refuses any change to it, whatever code asks. The one change let
-- through is a deleted user's reference becoming null (the ON DELETE SET NULL of created_by / signed_off_by).
CREATE OR REPLACE FUNCTION "loftline_plan_version_locked"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF OLD.review_state = 'signed_off' THEN
    IF (NEW.created_by IS NOT DISTINCT FROM OLD.created_by OR NEW.created_by IS NULL)
       AND (NEW.signed_off_by IS NOT DISTINCT FROM OLD.signed_off_by OR NEW.signed_off_by IS NULL)
       AND (to_jsonb(NEW) - 'created_by' - 'signed_off_by') = (to_jsonb(OLD) - 'created_by' - 'signed_off_by') THEN
      RETURN NEW;
    END IF;
    RAISE EXCEPTION 'plan version % (number %) is signed off and locked', OLD.id, OLD.number USING ERRCODE = 'check_violation';
  END IF;
  RETURN NEW;
END
$$;--> statement-breakpoint
CREATE TRIGGER "plan_version_locked" BEFORE UPDATE ON "plan_version" FOR EACH ROW EXECUTE FUNCTION "loftline_plan_version_locked"();
