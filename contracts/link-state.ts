/** What the link tells Loftline about itself while it hands a version to an aircraft and follows the flight. */
import { z } from 'zod';

/** The link's steps, in order; `not-ready` ends a run whose upload or read-back failed. */
const linkSteps = ['connecting', 'uploading', 'verifying', 'ready', 'following', 'finished', 'not-ready'] as const;
const linkStepSchema = z.enum(linkSteps);
export type LinkStep = z.infer<typeof linkStepSchema>;

/** POST body: one report from one run of the link. */
export const reportLinkStateSchema = z.object({
  /** One id per run of the link. */
  run: z.uuid(),
  step: linkStepSchema,
  /** The link's own words for the step (one line). */
  message: z.string().max(500),
  /** How the link reaches the aircraft ("udp 127.0.0.1:14550", "serial /dev/ttyUSB0 at 57600 baud"). */
  connection: z.string().max(200),
  /** The aircraft's MAVLink system and component ids and MAVLink version, once its heartbeat was heard. */
  aircraft: z.object({ sysid: z.number().int().min(0).max(255), compid: z.number().int().min(0).max(255), mavlink: z.number().int().min(1).max(2) }).nullable(),
});
export type ReportLinkState = z.infer<typeof reportLinkStateSchema>;

/** The latest report of a version's link, as the leg sheet shows it. */
export const linkStateSchema = reportLinkStateSchema.extend({ reportedAt: z.string(), reportedBy: z.string() });
export type LinkState = z.infer<typeof linkStateSchema>;
