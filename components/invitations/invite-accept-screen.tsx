/** The invitation link's page: sign in or sign up with the invited address, see the team and role, accept. */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { roleLabels, roleSummaries } from '../../contracts/roles';
import { ApiError, errorMessage } from '../api/api-error';
import { AuthFrame } from '../auth/auth-frame';
import { SignInForm } from '../auth/sign-in-form';
import { SignUpForm } from '../auth/sign-up-form';
import { formatDay } from '../projects/format-date';
import { space } from '../theme';
import { Badge, Banner, Button, Loading, Text, TextLink } from '../ui';
import { invitationStatusLabels } from './invitation-status';
import { useInviteAccept } from './use-invite-accept';

/** Route /invite/:token, outside both the signed-in and signed-out areas so the link works from either side. */
export function InviteAcceptScreen() {
  const f = useInviteAccept();
  if (f.stage === 'checking') return <Loading fill label="Checking your session…" />;
  if (f.stage === 'signed-out') return <SignedOutInvite />;
  if (f.stage === 'session-failed') {
    return (
      <AuthFrame title="Team invitation">
        <Banner tone="danger" title="Loftline is not answering" message={errorMessage(f.me.error)}>
          <Button label="Try again" variant="secondary" size="compact" onPress={() => void f.me.refetch()} />
        </Banner>
      </AuthFrame>
    );
  }

  const email = f.me.data?.user.email ?? '';
  const p = f.preview;
  const otherAddress = p.error instanceof ApiError && p.error.code === 'invitation_other_address';
  return (
    <AuthFrame title="Team invitation">
      <Text tone="muted" testID="invite-signed-in-as">
        Signed in as {email}.
      </Text>
      {p.isPending ? <Loading label="Reading the invitation…" /> : null}
      {p.isError ? (
        <Banner tone="danger" title={otherAddress ? 'This invitation is for another address' : 'This link does not work'} message={errorMessage(p.error)} testID="invite-unavailable">
          {otherAddress ? <Button label="Sign out and use the invited address" variant="secondary" size="compact" busy={f.signingOut} onPress={() => void f.signOut()} testID="invite-sign-out" /> : null}
        </Banner>
      ) : null}
      {p.data ? (
        <View style={styles.offer} testID="invite-offer">
          <Text variant="title" testID="invite-team">
            {p.data.teamName}
          </Text>
          <View style={styles.line}>
            <Text>Role</Text>
            <Badge label={roleLabels[p.data.role]} tone="primary" testID="invite-role-offered" />
            <Badge label={invitationStatusLabels[p.data.status].label} tone={invitationStatusLabels[p.data.status].tone} testID="invite-status" />
          </View>
          <Text tone="muted">{roleSummaries[p.data.role]}</Text>
          <Text variant="label" tone="muted">
            {p.data.invitedBy ? `Invited by ${p.data.invitedBy}. ` : ''}
            {p.data.status === 'pending' ? `Valid until ${formatDay(p.data.expiresAt)}.` : ''}
          </Text>
          {f.failure ? <Banner tone="danger" title="Not joined" message={f.failure} testID="invite-failure" /> : null}
          {p.data.status === 'pending' ? (
            <Button label={`Join ${p.data.teamName}`} busy={f.accepting} onPress={() => void f.accept()} testID="invite-accept" />
          ) : (
            <Banner
              tone="caution"
              testID="invite-closed"
              message={
                p.data.status === 'accepted'
                  ? 'This invitation has already been used.'
                  : p.data.status === 'expired'
                    ? 'This invitation has expired. Ask the team owner to send a new one.'
                    : 'The team owner revoked this invitation.'
              }
            />
          )}
        </View>
      ) : null}
      <TextLink href="/" label="Go to Loftline without joining" />
    </AuthFrame>
  );
}

/** Signed out: the server shows the team and role only to the invited address, so sign-in or sign-up comes first. */
function SignedOutInvite() {
  const [mode, setMode] = useState<'sign-in' | 'sign-up'>('sign-in');
  const [created, setCreated] = useState(false);
  return (
    <AuthFrame
      title="You have been invited to a Loftline team"
      footer={
        <>
          <Text tone="muted">{mode === 'sign-in' ? 'No account with that address yet?' : 'Already have an account?'}</Text>
          <Button
            label={mode === 'sign-in' ? 'Create an account' : 'Sign in instead'}
            variant="quiet"
            size="compact"
            onPress={() => setMode(mode === 'sign-in' ? 'sign-up' : 'sign-in')}
            testID="invite-switch-form"
          />
        </>
      }
    >
      <Text testID="invite-signed-out">
        Sign in, or create an account, with the e-mail address the invitation was sent to. Then this page shows the team and your role, and
        you can join.
      </Text>
      {created ? (
        <Banner tone="success" testID="invite-account-created" message="Not signed in with that password. If that address already had an account, sign in below with its own password to see the invitation." />
      ) : null}
      {mode === 'sign-in' ? (
        <SignInForm />
      ) : (
        <SignUpForm
          onDone={() => {
            setCreated(true);
            setMode('sign-in');
          }}
        />
      )}
    </AuthFrame>
  );
}

const styles = StyleSheet.create({
  offer: { gap: space.sm },
  line: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
});
