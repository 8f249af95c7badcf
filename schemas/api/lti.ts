import { z } from 'zod';
import type { AsJson } from './as-json.ts';

/** An absolute http(s) URL of a platform's endpoint. */
const EndpointUrl = z.url({ protocol: /^https?$/, message: 'an absolute http or https URL' }).max(2000);
/** An identifier the platform chose (client id, deployment id, context or resource link id): at most 255 characters (LTI Core 1.3, 5.3.3 and 5.3.5). */
const PlatformText = z.string().min(1, 'empty').max(255);

/** What the admin registers of a learning platform, bound to one course. */
export const PlatformRegistration = z.object({
  courseId: z.number().int().positive(),
  issuer: EndpointUrl,
  clientId: PlatformText,
  deploymentIds: z.array(PlatformText).min(1, 'at least one deployment id').max(100),
  authUrl: EndpointUrl,
  tokenUrl: EndpointUrl,
  jwksUrl: EndpointUrl,
});
export type PlatformRegistration = z.infer<typeof PlatformRegistration>;

export const Platform = PlatformRegistration.extend({ id: z.number(), createdAt: z.date() });
export type Platform = AsJson<z.infer<typeof Platform>>;

export const PlatformList = z.object({ platforms: z.array(Platform) });

/** Our key set: the public halves of the current signing key and of the retired keys still served. */
export const KeySet = z.object({
  keys: z.array(z.object({ kty: z.literal('RSA'), n: z.string(), e: z.string(), kid: z.string(), alg: z.literal('RS256'), use: z.literal('sig') })),
});
export type KeySet = z.infer<typeof KeySet>;

/** A rotation: the new key that signs from now on, and the key it retires (null on the first). */
export const KeyRotated = z.object({ kid: z.string(), retired: z.string().nullable() });

/** Third-party initiated login (1EdTech Security Framework 1.0, 5.1.1.1), as query or form fields. */
export const LoginInitiation = z.object({
  iss: z.string().min(1).max(2000),
  login_hint: z.string().min(1).max(2000),
  target_link_uri: z.string().min(1).max(2000),
  lti_message_hint: z.string().max(4000).optional(),
  client_id: z.string().max(255).optional(),
  lti_deployment_id: z.string().max(255).optional(),
});

/**
 * The authentication response, form-posted (Security Framework 1.0, 5.1.1.3). Both fields are
 * optional here so that a launch without one is refused with a logged reason, as any other refusal.
 */
export const LaunchPost = z.object({ id_token: z.string().max(50_000).optional(), state: z.string().max(200).optional() });

/** The one-time ticket a launch's page posts back to this origin. */
export const TicketPost = z.object({ ticket: z.string().min(1).max(200) });

/** A platform's resource link placed on an assignment and section: a learner's launch from it lands there. */
export const PlacementChange = z.object({ platformId: z.number().int().positive(), contextId: PlatformText, resourceLinkId: PlatformText });
export const Placement = PlacementChange.extend({ assignmentId: z.number(), sectionId: z.number() });

/** An HTML page for the browser (the launch's step to this origin, or why a launch was refused). */
export const HtmlPage = z.string().describe('an HTML page');

/** What a roster pull from the platform did: students enrolled (new or again), withdrawn, and listed learners left as they were. */
export const RosterPulled = z.object({ enrolled: z.number().int(), withdrawn: z.number().int(), unchanged: z.number().int() });
