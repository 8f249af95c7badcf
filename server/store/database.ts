import type { ColumnType, Generated } from 'kysely';

/** Table types for kysely: one interface per table, columns as the database returns them. */
type Ref = number;
/** JSON goes in as text (pg would turn a JS array into a SQL array) and comes out parsed. */
type Json<T> = ColumnType<T, string, string>;

export type EnrolmentStatus = 'enrolled' | 'withdrawn' | 'removed';
export type GradeSendState = 'waiting' | 'sent' | 'failed';

export interface Database {
  courses: { id: Generated<number>; name: string; created_at: Generated<Date> };
  sections: { id: Generated<number>; course_id: Ref; name: string };
  staff: { id: Generated<number>; course_id: Ref; handle: string; role: 'instructor' | 'ta' };
  ta_sections: { staff_id: Ref; section_id: Ref };
  api_tokens: { id: Generated<number>; staff_id: Ref; token_hash: string; created_at: Generated<Date>; revoked_at: Date | null };
  sessions: { id: Generated<number>; staff_id: Ref; session_hash: string; created_at: Generated<Date>; expires_at: Date };
  students: { id: Generated<number>; course_id: Ref; section_id: Ref; student_id: string; display_name: string | null; status: Generated<EnrolmentStatus> };
  roster_events: { id: Generated<number>; student_row_id: Ref; status: EnrolmentStatus; staff_id: Ref | null; at: Generated<Date> };
  assignments: {
    id: Generated<number>;
    course_id: Ref;
    title: string;
    kind: string;
    settings: Json<unknown>;
    settings_version: Generated<number>;
    created_at: Generated<Date>;
  };
  submissions: {
    id: Generated<number>;
    assignment_id: Ref;
    student_row_id: Ref;
    version: number;
    payload: Json<unknown>;
    submitted_by: Ref | null;
    created_at: Generated<Date>;
    /** Who sent it: staff (an upload for the section) or the student through their own door. */
    source: Generated<'staff' | 'student'>;
    /** Stored after the section's deadline for the assignment. */
    late: Generated<boolean>;
    /** Late under the hold policy, and not yet accepted by a TA: not released until it is. */
    held: Generated<boolean>;
    late_accepted_by: Ref | null;
    late_accepted_at: Date | null;
  };
  results: {
    id: Generated<number>;
    submission_id: Ref;
    engine_version: string;
    settings_version: number;
    settings: Json<unknown>;
    status: string;
    score: number | null;
    max_score: number;
    refit: Json<unknown> | null;
    findings: Json<unknown>;
    /** What the results page shows of it before overrides (page-summaries.ts); null in results stored before it was kept. */
    page_summary: Json<unknown> | null;
    released_at: Date | null;
    released_by: Ref | null;
    created_at: Generated<Date>;
  };
  overrides: {
    id: Generated<number>;
    submission_id: Ref;
    finding_id: string;
    points_before: number;
    points_after: number;
    reason: string;
    /** The reason is printed on the student's sheet; false keeps it in the audit trail only. */
    reason_shown: Generated<boolean>;
    staff_id: Ref;
    created_at: Generated<Date>;
  };
  /** Each student's latest version of an assignment and that version's latest result, kept with every result stored. */
  latest_results: { assignment_id: Ref; student_row_id: Ref; submission_id: Ref; version: number; result_id: Ref };
  releases: {
    id: Generated<number>;
    submission_id: Ref;
    result_id: Ref;
    overrides_through: Generated<number>;
    choices_through: Generated<number>;
    released_by: Ref | null;
    released_at: Generated<Date>;
  };
  signal_choices: {
    id: Generated<number>;
    submission_id: Ref;
    code: string;
    path: string;
    on_sheet: boolean;
    staff_id: Ref;
    created_at: Generated<Date>;
  };
  idempotency_keys: {
    staff_id: Ref;
    key: string;
    request_hash: string;
    status_code: number;
    body: Json<unknown>;
    created_at: Generated<Date>;
  };
  regrades: {
    id: string;
    assignment_id: Ref;
    section_id: Ref | null;
    settings: Json<unknown>;
    settings_version: number;
    total: number;
    done: Generated<number>;
    status: Generated<'running' | 'finished' | 'failed'>;
    error: string | null;
    started_at: Generated<Date>;
    finished_at: Date | null;
  };
  /** A regrade's submissions, part by part, fixed at its start; done_at once the part's results are stored. */
  regrade_parts: { regrade_id: string; part: number; submission_ids: Json<number[]>; done_at: Date | null };
  /** A large section's ZIP or summary drawn by a job, kept (content) until it expires. */
  section_files: {
    id: string;
    section_id: Ref;
    assignment_id: Ref;
    document: 'feedback.zip' | 'summary.pdf';
    total: number;
    done: Generated<number>;
    status: Generated<'running' | 'finished' | 'failed'>;
    error: string | null;
    name_ascii: string | null;
    name_unicode: string | null;
    content: Buffer | null;
    started_at: Generated<Date>;
    finished_at: Date | null;
    expires_at: Date;
  };
  /** A student's access code, stored only as its hash; at most one live (unrevoked) code per student. */
  access_codes: { id: Generated<number>; student_row_id: Ref; code_hash: string; issued_by: Ref; issued_at: Generated<Date>; revoked_at: Date | null };
  student_sessions: { id: Generated<number>; student_row_id: Ref; session_hash: string; created_at: Generated<Date>; expires_at: Date };
  /** A section's deadline for an assignment. */
  deadlines: { assignment_id: Ref; section_id: Ref; due_at: Date; set_by: Ref; set_at: Generated<Date> };
  /** The first time a student opened a release of their feedback. */
  feedback_reads: { release_id: Ref; student_row_id: Ref; first_read_at: Generated<Date> };
  /** A learning platform the admin registered, bound to one course. */
  lti_platforms: { id: Generated<number>; course_id: Ref; issuer: string; client_id: string; auth_url: string; token_url: string; jwks_url: string; created_at: Generated<Date> };
  lti_deployments: { platform_id: Ref; deployment_id: string };
  /** Our signing keys as JWK JSON; a retired key stays in the key set a while, for the tokens it signed. */
  lti_keys: { kid: string; public_jwk: string; private_jwk: string; created_at: Generated<Date>; retired_at: Date | null };
  /** A launch under way: its state (as a hash) and nonce, single use, short-lived. */
  lti_login_states: { state_hash: string; nonce: string; platform_id: Ref; expires_at: Date; used_at: Date | null };
  /** Someone who came by a launch: the platform's subject id, display name and roles, and who they are here. */
  lti_users: { id: Generated<number>; platform_id: Ref; sub: string; display_name: string | null; roles: Json<string[]>; student_row_id: Ref | null; staff_id: Ref | null; first_launch_at: Generated<Date> };
  /** A platform's resource link placed on an assignment and section. */
  lti_placements: { platform_id: Ref; context_id: string; resource_link_id: string; assignment_id: Ref; section_id: Ref; placed_by: Ref | null; placed_at: Generated<Date> };
  /** A verified launch waiting for its same-site step (a hash, single use, a minute long). */
  lti_tickets: { ticket_hash: string; student_row_id: Ref | null; staff_id: Ref | null; expires_at: Date };
  /** A deep linking request waiting for the instructor's choice (a hash, single use, short-lived). */
  /** A platform context's membership service URL, for roster pulls (NRPS 2.0). */
  /** A platform context's service URLs, as launches sent them. */
  lti_contexts: { platform_id: Ref; context_id: string; memberships_url: string | null; line_items_url: string | null };
  /** The line item an assignment's scores go to in a platform context (AGS 2.0). */
  lti_line_items: { platform_id: Ref; context_id: string; assignment_id: Ref; url: string };
  /** Where sending one student's released score for an assignment to their platform stands. */
  grade_sends: {
    assignment_id: Ref;
    student_row_id: Ref;
    platform_id: Ref;
    generation: Generated<number>;
    state: GradeSendState;
    reason: string | null;
    tries: Generated<number>;
    queued_at: Generated<Date>;
    sent_at: Date | null;
    sent_score: number | null;
  };
  lti_deep_links: { ticket_hash: string; platform_id: Ref; deployment_id: string; return_url: string; data: string | null; expires_at: Date };
}
