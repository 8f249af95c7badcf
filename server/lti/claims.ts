/** The claims of an LTI message (LTI Core 1.3, section 5), by their full names. */
const LTI = 'https://purl.imsglobal.org/spec/lti/claim/';
export const CLAIM = {
  messageType: `${LTI}message_type`,
  version: `${LTI}version`,
  deploymentId: `${LTI}deployment_id`,
  targetLinkUri: `${LTI}target_link_uri`,
  resourceLink: `${LTI}resource_link`,
  roles: `${LTI}roles`,
  context: `${LTI}context`,
  custom: `${LTI}custom`,
} as const;

/** The claims of Deep Linking 2.0 (4.4.1 request settings; 4.5 response data and content items). */
const DL = 'https://purl.imsglobal.org/spec/lti-dl/claim/';
export const DL_CLAIM = {
  settings: `${DL}deep_linking_settings`,
  data: `${DL}data`,
  contentItems: `${DL}content_items`,
} as const;

/** The claim of NRPS 2.0 a launch carries when the platform offers the context's membership service. */
export const NRPS_CLAIM = 'https://purl.imsglobal.org/spec/lti-nrps/claim/namesroleservice';

/** Context roles of the membership vocabulary (LTI Core 1.3, appendix A.2.3 and, for sub-roles, A.2.3.1). */
const MEMBERSHIP = 'http://purl.imsglobal.org/vocab/lis/v2/membership';
export const ROLE = {
  learner: `${MEMBERSHIP}#Learner`,
  instructor: `${MEMBERSHIP}#Instructor`,
  teachingAssistant: `${MEMBERSHIP}/Instructor#TeachingAssistant`,
} as const;

export type LaunchedRole = 'instructor' | 'ta' | 'student';

/**
 * Our role for a launch's roles. A sub-role comes with its principal role (A.2.3.1: a TA is also
 * sent as Instructor), so the TA sub-role is looked for first; then Instructor, then Learner. The
 * simple names the specification still allows for context roles are read as their full URIs. Any other role set maps to
 * none: a launch by a mentor or an administrator of the platform opens nothing here yet.
 */
export function launchedRole(roles: readonly string[]): LaunchedRole | undefined {
  const has = (full: string) => roles.includes(full) || roles.includes(full.slice(full.lastIndexOf('#') + 1));
  if (roles.includes(ROLE.teachingAssistant)) return 'ta';
  if (has(ROLE.instructor)) return 'instructor';
  if (has(ROLE.learner)) return 'student';
  return undefined;
}

/**
 * AGS 2.0: the claim a launch carries when the platform offers the context's grade services (the
 * line item container, and the line item bound to the launched link when it has one), and the scopes
 * a token for them asks: line items read and managed, scores posted.
 */
export const AGS_CLAIM = 'https://purl.imsglobal.org/spec/lti-ags/claim/endpoint';
const AGS_SCOPE = 'https://purl.imsglobal.org/spec/lti-ags/scope/';
export const AGS_SCOPES = { lineItem: `${AGS_SCOPE}lineitem`, score: `${AGS_SCOPE}score` } as const;
