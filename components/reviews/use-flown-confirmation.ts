/** State of the "confirm as flown" card: the version's confirmation status, the reasons form, and sending it. */
import { useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { confirmFlownSchema, flownConfirmationSchema, type FlownConfirmation } from '../../contracts/flown-confirmation';
import { signOffReasonSchema } from '../../contracts/reviews';
import { apiFetch } from '../api/api-fetch';
import { errorMessage } from '../api/api-error';
import { useCurrentTeam } from '../team/current-team-context';
import { reviewKeys, versionApiPath } from './reviews.queries';

const flownKey = (teamId: string, planId: string, versionId: string) => [...reviewKeys.team(teamId), 'flown', planId, versionId] as const;

export function useFlownConfirmation({ planId, versionId }: { planId: string; versionId: string }) {
  const { team } = useCurrentTeam();
  const teamId = team?.id ?? '';
  const queryClient = useQueryClient();
  const status = useQuery({
    queryKey: flownKey(teamId, planId, versionId),
    queryFn: ({ signal }) => apiFetch(`${versionApiPath(teamId, planId, versionId)}/flown-confirmation`, { schema: flownConfirmationSchema, signal }),
    enabled: Boolean(teamId),
  });
  const send = useMutation({
    mutationFn: (body: { comment?: string; reasons: Array<{ key: string; reason: string }> }) =>
      apiFetch(`${versionApiPath(teamId, planId, versionId)}/confirm-flown`, { method: 'POST', body, schema: flownConfirmationSchema }),
    onSuccess: (s: FlownConfirmation) => {
      queryClient.setQueryData(flownKey(teamId, planId, versionId), s);
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: reviewKeys.audit(teamId, planId) }),
        queryClient.invalidateQueries({ queryKey: ['reports', teamId] }),
      ]);
    },
  });
  const [open, setOpen] = useState(false);
  const [comment, setComment] = useState('');
  const [reasons, setReasons] = useState<Record<string, string>>({});
  const [reasonErrors, setReasonErrors] = useState<Record<string, string>>({});
  const [refusal, setRefusal] = useState<string | null>(null);

  const confirm = async () => {
    const s = status.data;
    if (!s) return;
    // the server's own schemas, so the message under each box is the one the server would send
    const errorsByKey: Record<string, string> = {};
    for (const f of s.shortfalls) {
      const r = signOffReasonSchema.safeParse({ key: f.key, reason: reasons[f.key] ?? '' });
      if (!r.success) errorsByKey[f.key] = r.error.issues[0]?.message ?? 'Give a reason.';
    }
    setReasonErrors(errorsByKey);
    const body = confirmFlownSchema.safeParse({ comment: comment || undefined, reasons: s.shortfalls.map((f) => ({ key: f.key, reason: (reasons[f.key] ?? '').trim() })) });
    if (Object.keys(errorsByKey).length || !body.success) return;
    setRefusal(null);
    try {
      await send.mutateAsync({ comment: body.data.comment, reasons: body.data.reasons ?? [] });
      setOpen(false);
    } catch (e) {
      setRefusal(errorMessage(e));
      void status.refetch();
    }
  };

  return {
    status, open, setOpen, comment, setComment, reasons, reasonErrors, refusal, busy: send.isPending, confirm,
    setReason: (key: string, text: string) => setReasons((r) => ({ ...r, [key]: text })),
  };
}
