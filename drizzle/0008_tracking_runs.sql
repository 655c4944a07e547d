CREATE TABLE "tracking_run" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"team_id" text NOT NULL,
	"shot_id" uuid NOT NULL,
	"status" text DEFAULT 'queued' NOT NULL,
	"seed_frame" integer NOT NULL,
	"seeds" jsonb NOT NULL,
	"frame_start" integer NOT NULL,
	"frame_end" integer NOT NULL,
	"phase" text,
	"done" integer DEFAULT 0 NOT NULL,
	"total" integer DEFAULT 0 NOT NULL,
	"job_id" text,
	"attempts" integer DEFAULT 0 NOT NULL,
	"proposals" jsonb,
	"failure_reason" text,
	"requested_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"started_at" timestamp with time zone,
	"finished_at" timestamp with time zone,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "tracking_run" ADD CONSTRAINT "tracking_run_team_id_organization_id_fk" FOREIGN KEY ("team_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tracking_run" ADD CONSTRAINT "tracking_run_shot_id_shot_id_fk" FOREIGN KEY ("shot_id") REFERENCES "public"."shot"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tracking_run" ADD CONSTRAINT "tracking_run_requested_by_user_id_fk" FOREIGN KEY ("requested_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "tracking_run_shot_idx" ON "tracking_run" USING btree ("shot_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "tracking_run_live_idx" ON "tracking_run" USING btree ("shot_id") WHERE "tracking_run"."status" in ('queued', 'running');