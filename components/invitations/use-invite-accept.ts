/** The invitation link's flow: session check, what the link offers, accepting it and switching to the new team. */
import { useQueryClient } from '@tanstack/react-query';
import { useLocalSearchParams, useRouter } from 'expo-router';
import { useState } from 'react';
import { ApiError, errorMessage } from '../api/api-error';
import { useMe } from '../api/me.queries';
import { authClient, authFailureFrom } from '../auth/auth-client';
import { homeFor } from '../navigation/nav-items';
import { rememberTeam } from '../team/team-storage';
import { useAcceptInvitation, useInvitationPreview } from './invitations.queries';
import { forgetDeviceQueries } from '../api/device-queries';

type InviteStage = 'checking' | 'signed-out' | 'session-failed' | 'signed-in';

/** After accepting, the new team becomes current on this device and the user lands on their role's home screen. */
export function useInviteAccept() {
  const { token } = useLocalSearchParams<{ token: string }>();
  const me = useMe();
  const queryClient = useQueryClient();
  const router = useRouter();
  const signedIn = me.isSuccess;
  const preview = useInvitationPreview(token, signedIn);
  const accept = useAcceptInvitation(token ?? '');
  const [failure, setFailure] = useState<string | null>(null);
  const [signingOut, setSigningOut] = useState(false);

  const stage: InviteStage = me.isPending
    ? 'checking'
    : me.isSuccess
      ? 'signed-in'
      : me.error instanceof ApiError && me.error.isUnauthenticated
        ? 'signed-out'
        : 'session-failed';

  const acceptNow = async () => {
    setFailure(null);
    try {
      const joined = await accept.mutateAsync();
      rememberTeam(joined.teamId);
      router.replace(homeFor(joined.role));
    } catch (e) {
      setFailure(errorMessage(e));
    }
  };

  /** For someone signed in with another address: sign out here and come back to this same link. */
  const signOut = async () => {
    setSigningOut(true);
    const { error } = await authClient.signOut();
    setSigningOut(false);
    const refused = authFailureFrom(error);
    if (refused) {
      setFailure(refused.message);
      return;
    }
    rememberTeam(null);
    forgetDeviceQueries(); // the next person on this device must not open as this user offline
    await queryClient.resetQueries();
  };

  return { token, stage, me, preview, accept: acceptNow, accepting: accept.isPending, failure, signOut, signingOut };
}
