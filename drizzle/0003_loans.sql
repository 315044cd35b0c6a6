CREATE TABLE "solves" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"subject_type" text NOT NULL,
	"subject_id" uuid,
	"subject_version" integer,
	"kind" text NOT NULL,
	"status" text NOT NULL,
	"rate" numeric(60, 40),
	"request" jsonb NOT NULL,
	"result" jsonb NOT NULL,
	"engine_version" text NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "loan_versions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"loan_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"entry_mode" text NOT NULL,
	"terms" jsonb NOT NULL,
	"amount_financed" numeric(18, 2) NOT NULL,
	"finance_charge" numeric(18, 2) NOT NULL,
	"total_of_payments" numeric(18, 2) NOT NULL,
	"solve_id" uuid,
	"changes" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "loan_versions_loan_version_key" UNIQUE("loan_id","version")
);
--> statement-breakpoint
CREATE TABLE "loans" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"reference" text NOT NULL,
	"borrower_name" text NOT NULL,
	"regime" text NOT NULL,
	"status" text DEFAULT 'draft' NOT NULL,
	"current_version" integer DEFAULT 1 NOT NULL,
	"disclosed_version" integer,
	"created_by" uuid,
	"updated_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "loans_workspace_reference_key" UNIQUE("workspace_id","reference")
);
--> statement-breakpoint
CREATE TABLE "tolerance_checks" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"workspace_id" uuid NOT NULL,
	"loan_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"solve_id" uuid,
	"disclosed_apr" numeric(12, 6) NOT NULL,
	"apr_accurate" boolean NOT NULL,
	"disclosed_finance_charge" numeric(18, 2),
	"finance_charge_accurate" boolean,
	"secured_by_real_property" boolean DEFAULT false NOT NULL,
	"detail" jsonb NOT NULL,
	"resolved_at" timestamp with time zone,
	"resolved_by" uuid,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "solves" ADD CONSTRAINT "solves_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "solves" ADD CONSTRAINT "solves_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "loan_versions" ADD CONSTRAINT "loan_versions_loan_id_loans_id_fk" FOREIGN KEY ("loan_id") REFERENCES "public"."loans"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "loan_versions" ADD CONSTRAINT "loan_versions_solve_id_solves_id_fk" FOREIGN KEY ("solve_id") REFERENCES "public"."solves"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "loan_versions" ADD CONSTRAINT "loan_versions_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "loans" ADD CONSTRAINT "loans_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "loans" ADD CONSTRAINT "loans_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "loans" ADD CONSTRAINT "loans_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tolerance_checks" ADD CONSTRAINT "tolerance_checks_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tolerance_checks" ADD CONSTRAINT "tolerance_checks_loan_id_loans_id_fk" FOREIGN KEY ("loan_id") REFERENCES "public"."loans"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tolerance_checks" ADD CONSTRAINT "tolerance_checks_solve_id_solves_id_fk" FOREIGN KEY ("solve_id") REFERENCES "public"."solves"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tolerance_checks" ADD CONSTRAINT "tolerance_checks_resolved_by_users_id_fk" FOREIGN KEY ("resolved_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tolerance_checks" ADD CONSTRAINT "tolerance_checks_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "solves_subject_idx" ON "solves" USING btree ("subject_type","subject_id","created_at");--> statement-breakpoint
CREATE INDEX "solves_workspace_idx" ON "solves" USING btree ("workspace_id","created_at");--> statement-breakpoint
CREATE INDEX "loans_workspace_updated_idx" ON "loans" USING btree ("workspace_id","updated_at");--> statement-breakpoint
CREATE INDEX "tolerance_checks_open_idx" ON "tolerance_checks" USING btree ("workspace_id","resolved_at");