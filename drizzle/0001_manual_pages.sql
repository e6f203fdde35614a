CREATE TABLE "manual_pages" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"diagram_id" uuid NOT NULL,
	"owner_id" text NOT NULL,
	"storage_key" text NOT NULL,
	"content_type" text NOT NULL,
	"byte_size" integer NOT NULL,
	"original_name" text DEFAULT '' NOT NULL,
	"page_order" integer DEFAULT 0 NOT NULL,
	"opacity" double precision DEFAULT 0.5 NOT NULL,
	"scale" double precision DEFAULT 1 NOT NULL,
	"offset_x" double precision DEFAULT 0 NOT NULL,
	"offset_y" double precision DEFAULT 0 NOT NULL,
	"locked" boolean DEFAULT false NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "manual_pages_content_type" CHECK ("manual_pages"."content_type" in ('image/png', 'image/jpeg', 'image/webp'))
);
--> statement-breakpoint
ALTER TABLE "manual_pages" ADD CONSTRAINT "manual_pages_diagram_id_diagrams_id_fk" FOREIGN KEY ("diagram_id") REFERENCES "public"."diagrams"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "manual_pages" ADD CONSTRAINT "manual_pages_owner_id_users_id_fk" FOREIGN KEY ("owner_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "manual_pages_diagram_idx" ON "manual_pages" USING btree ("diagram_id","page_order");--> statement-breakpoint
CREATE UNIQUE INDEX "manual_pages_storage_key" ON "manual_pages" USING btree ("storage_key");