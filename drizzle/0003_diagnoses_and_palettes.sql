CREATE TYPE "public"."diagnosis_status" AS ENUM('open', 'concluded');--> statement-breakpoint
CREATE TYPE "public"."reading_outcome" AS ENUM('value', 'over-range', 'unreachable');--> statement-breakpoint
CREATE TABLE "diagnoses" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"diagram_id" uuid NOT NULL,
	"vehicle_id" uuid NOT NULL,
	"started_by" text,
	"diagram_revision" integer NOT NULL,
	"title" text NOT NULL,
	"scenario" jsonb NOT NULL,
	"marks" jsonb NOT NULL,
	"meter" jsonb NOT NULL,
	"status" "diagnosis_status" DEFAULT 'open' NOT NULL,
	"found_suspect" text,
	"conclusion" text DEFAULT '' NOT NULL,
	"parts_replaced" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"concluded_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "diagnosis_readings" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"diagnosis_id" uuid NOT NULL,
	"client_id" uuid NOT NULL,
	"probe_id" text NOT NULL,
	"outcome" "reading_outcome" NOT NULL,
	"value" double precision,
	"unit" text DEFAULT '' NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"taken_by" text,
	"taken_at" timestamp with time zone NOT NULL,
	"superseded_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "diagnosis_readings_value" CHECK (("diagnosis_readings"."outcome" = 'value') = ("diagnosis_readings"."value" is not null))
);
--> statement-breakpoint
CREATE TABLE "palettes" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"owner_id" text NOT NULL,
	"name" text NOT NULL,
	"colours" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "diagnoses" ADD CONSTRAINT "diagnoses_diagram_id_diagrams_id_fk" FOREIGN KEY ("diagram_id") REFERENCES "public"."diagrams"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "diagnoses" ADD CONSTRAINT "diagnoses_vehicle_id_vehicles_id_fk" FOREIGN KEY ("vehicle_id") REFERENCES "public"."vehicles"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "diagnoses" ADD CONSTRAINT "diagnoses_started_by_users_id_fk" FOREIGN KEY ("started_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "diagnosis_readings" ADD CONSTRAINT "diagnosis_readings_diagnosis_id_diagnoses_id_fk" FOREIGN KEY ("diagnosis_id") REFERENCES "public"."diagnoses"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "diagnosis_readings" ADD CONSTRAINT "diagnosis_readings_taken_by_users_id_fk" FOREIGN KEY ("taken_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "palettes" ADD CONSTRAINT "palettes_owner_id_users_id_fk" FOREIGN KEY ("owner_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "diagnoses_vehicle_idx" ON "diagnoses" USING btree ("vehicle_id","created_at");--> statement-breakpoint
CREATE INDEX "diagnoses_diagram_idx" ON "diagnoses" USING btree ("diagram_id");--> statement-breakpoint
CREATE UNIQUE INDEX "diagnosis_readings_client" ON "diagnosis_readings" USING btree ("diagnosis_id","client_id");--> statement-breakpoint
CREATE INDEX "diagnosis_readings_diagnosis_idx" ON "diagnosis_readings" USING btree ("diagnosis_id","taken_at");--> statement-breakpoint
CREATE INDEX "palettes_owner_idx" ON "palettes" USING btree ("owner_id");--> statement-breakpoint
CREATE UNIQUE INDEX "palettes_owner_name" ON "palettes" USING btree ("owner_id","name");