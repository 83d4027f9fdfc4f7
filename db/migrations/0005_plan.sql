CREATE TYPE "public"."power_method" AS ENUM('poe', 'poe_splitter', 'existing_outlet', 'new_outlet');--> statement-breakpoint
CREATE TABLE "decision_history" (
	"id" text PRIMARY KEY NOT NULL,
	"site_id" text NOT NULL,
	"team_id" text NOT NULL,
	"device_id" text NOT NULL,
	"action" text NOT NULL,
	"after" jsonb,
	"before" jsonb,
	"reason" text NOT NULL,
	"forced" boolean DEFAULT false NOT NULL,
	"actor_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "device_decisions" (
	"site_id" text NOT NULL,
	"device_id" text NOT NULL,
	"team_id" text NOT NULL,
	"method" "power_method" NOT NULL,
	"poe_class" integer,
	"source_id" text,
	"port" integer,
	"splitter" jsonb,
	"reason" text NOT NULL,
	"forced" boolean DEFAULT false NOT NULL,
	"decided_by" text,
	"decided_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "device_decisions_site_id_device_id_pk" PRIMARY KEY("site_id","device_id")
);
--> statement-breakpoint
CREATE TABLE "site_plans" (
	"site_id" text PRIMARY KEY NOT NULL,
	"team_id" text NOT NULL,
	"prices" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"auto_placed" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"updated_by" text,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "decision_history" ADD CONSTRAINT "decision_history_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "decision_history" ADD CONSTRAINT "decision_history_team_id_teams_id_fk" FOREIGN KEY ("team_id") REFERENCES "public"."teams"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "decision_history" ADD CONSTRAINT "decision_history_actor_id_users_id_fk" FOREIGN KEY ("actor_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "device_decisions" ADD CONSTRAINT "device_decisions_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "device_decisions" ADD CONSTRAINT "device_decisions_team_id_teams_id_fk" FOREIGN KEY ("team_id") REFERENCES "public"."teams"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "device_decisions" ADD CONSTRAINT "device_decisions_decided_by_users_id_fk" FOREIGN KEY ("decided_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_plans" ADD CONSTRAINT "site_plans_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_plans" ADD CONSTRAINT "site_plans_team_id_teams_id_fk" FOREIGN KEY ("team_id") REFERENCES "public"."teams"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_plans" ADD CONSTRAINT "site_plans_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "decision_history_site_idx" ON "decision_history" USING btree ("site_id","created_at");