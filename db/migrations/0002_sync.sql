CREATE TABLE "item_conflicts" (
	"id" text PRIMARY KEY NOT NULL,
	"team_id" text NOT NULL,
	"site_id" text NOT NULL,
	"item_id" text NOT NULL,
	"field" text NOT NULL,
	"lost_value" jsonb,
	"kept_value" jsonb,
	"lost_by" text,
	"kept_by" text,
	"version" bigint NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "photos" (
	"id" text PRIMARY KEY NOT NULL,
	"team_id" text NOT NULL,
	"site_id" text NOT NULL,
	"item_id" text,
	"label" text DEFAULT '' NOT NULL,
	"mime" text NOT NULL,
	"size" integer NOT NULL,
	"object_key" text NOT NULL,
	"uploaded_by" text,
	"version" bigint NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sync_clients" (
	"client_id" text PRIMARY KEY NOT NULL,
	"user_id" text NOT NULL,
	"team_id" text NOT NULL,
	"last_mutation_id" bigint DEFAULT 0 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"last_seen_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sync_rejections" (
	"client_id" text NOT NULL,
	"mutation_id" bigint NOT NULL,
	"code" text NOT NULL,
	"message" text NOT NULL,
	"version" bigint NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "sync_rejections_client_id_mutation_id_pk" PRIMARY KEY("client_id","mutation_id")
);
--> statement-breakpoint
ALTER TABLE "items" ADD COLUMN "field_versions" jsonb DEFAULT '{}'::jsonb NOT NULL;--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "closet_room_id" text;--> statement-breakpoint
ALTER TABLE "item_conflicts" ADD CONSTRAINT "item_conflicts_team_id_teams_id_fk" FOREIGN KEY ("team_id") REFERENCES "public"."teams"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "item_conflicts" ADD CONSTRAINT "item_conflicts_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "item_conflicts" ADD CONSTRAINT "item_conflicts_item_id_items_id_fk" FOREIGN KEY ("item_id") REFERENCES "public"."items"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "item_conflicts" ADD CONSTRAINT "item_conflicts_lost_by_users_id_fk" FOREIGN KEY ("lost_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "item_conflicts" ADD CONSTRAINT "item_conflicts_kept_by_users_id_fk" FOREIGN KEY ("kept_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_team_id_teams_id_fk" FOREIGN KEY ("team_id") REFERENCES "public"."teams"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sync_clients" ADD CONSTRAINT "sync_clients_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sync_clients" ADD CONSTRAINT "sync_clients_team_id_teams_id_fk" FOREIGN KEY ("team_id") REFERENCES "public"."teams"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sync_rejections" ADD CONSTRAINT "sync_rejections_client_id_sync_clients_client_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."sync_clients"("client_id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "item_conflicts_team_version_idx" ON "item_conflicts" USING btree ("team_id","version");--> statement-breakpoint
CREATE INDEX "photos_team_version_idx" ON "photos" USING btree ("team_id","version");