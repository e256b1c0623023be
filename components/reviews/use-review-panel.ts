/** State of the review panel: the version's status and trail, which action form is open, and sending the action. */
import { useState } from 'react';
import { returnSchema, reviewNoteSchema, type Notification, type ReviewAction } from '../../contracts/reviews';
import { errorMessage } from '../api/api-error';
import { useCurrentTeam } from '../team/current-team-context';
import { useAuditTrail, useReviewAction, useVersionReview } from './reviews.queries';

export type ReviewPanelIds = { planId: string; versionId: string };

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
  const [refusal, setRefusal] = useState<string | null>(null);
  const [notification, setNotification] = useState<Notification | null>(null);

  const start = (action: ReviewAction) => {
    setOpen(action);
    setComment('');
    setCommentError(null);
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
    setRefusal(null);
    try {
      const out = await act.mutateAsync({ action: open, comment: parsed.data.comment || undefined });
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
    refusal,
    notification,
    busy: act.isPending,
    start,
    cancel,
    confirm,
  };
}
