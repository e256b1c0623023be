/** State of the review panel: the version's status and trail, which action form is open, and sending the action. */
import { useState } from 'react';
import { returnSchema, reviewNoteSchema, signOffReasonSchema, type Notification, type ReviewAction } from '../../contracts/reviews';
import { errorMessage } from '../api/api-error';
import { useCurrentTeam } from '../team/current-team-context';
import { useAuditTrail, useReviewAction, useVersionReview } from './reviews.queries';

type ReviewPanelIds = { planId: string; versionId: string };

/** Opening an action shows its comment box first: a sign-off or return is never one accidental tap. */
export function useReviewPanel({ planId, versionId }: ReviewPanelIds) {
  const { team, role } = useCurrentTeam();
  const teamId = team?.id;
  const status = useVersionReview(teamId, planId, versionId);
  const audit = useAuditTrail(teamId, planId);
  const act = useReviewAction(teamId ?? '', planId, versionId);
  const [open, setOpen] = useState<ReviewAction | null>(null);
  const [comment, setComment] = useState('');
  const [commentError, setCommentError] = useState<string | null>(null);
  // One reason per unmet requirement (keyed by the report's check key), required before a failing version is signed off.
  const [reasons, setReasons] = useState<Record<string, string>>({});
  const [reasonErrors, setReasonErrors] = useState<Record<string, string>>({});
  const unmet = open === 'sign-off' ? (status.data?.unmet ?? []) : [];
  const [refusal, setRefusal] = useState<string | null>(null);
  const [notification, setNotification] = useState<Notification | null>(null);

  const start = (action: ReviewAction) => {
    setOpen(action);
    setComment('');
    setCommentError(null);
    setReasons({});
    setReasonErrors({});
    setRefusal(null);
    setNotification(null);
  };

  const cancel = () => {
    setOpen(null);
    setCommentError(null);
  };

  const confirm = async () => {
    if (!open) return;
    // The same schemas the server applies, so the message under the box is the one the server would send.
    const parsed = (open === 'return' ? returnSchema : reviewNoteSchema).safeParse({ comment });
    if (!parsed.success) {
      setCommentError(parsed.error.issues[0]?.message ?? 'Check the comment.');
      return;
    }
    setCommentError(null);
    const errorsByKey: Record<string, string> = {};
    for (const u of unmet) {
      const r = signOffReasonSchema.safeParse({ key: u.key, reason: reasons[u.key] ?? '' });
      if (!r.success) errorsByKey[u.key] = r.error.issues[0]?.message ?? 'Give a reason.';
    }
    setReasonErrors(errorsByKey);
    if (Object.keys(errorsByKey).length) return;
    setRefusal(null);
    try {
      const out = await act.mutateAsync({
        action: open,
        comment: parsed.data.comment || undefined,
        reasons: unmet.map((u) => ({ key: u.key, reason: reasons[u.key]!.trim() })),
      });
      setNotification(out.notification ?? null);
      setOpen(null);
      setComment('');
    } catch (e) {
      setRefusal(errorMessage(e));
      // A 409 means someone else moved the version on: show its real state.
      void status.refetch();
    }
  };

  return {
    role,
    status,
    audit,
    open,
    comment,
    setComment,
    commentError,
    unmet,
    reasons,
    setReason: (key: string, text: string) => setReasons((r) => ({ ...r, [key]: text })),
    reasonErrors,
    refusal,
    notification,
    busy: act.isPending,
    start,
    cancel,
    confirm,
  };
}
