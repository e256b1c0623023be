import { describe, expect, it } from 'vitest';
import type { Invitation } from '../../contracts/invitations';
import { createInvitationSchema } from '../../contracts/invitations';
import { orderInvitations } from '../../components/invitations/invitation-status';

const inv = (id: string, status: Invitation['status'], createdAt: string, expiresAt: string): Invitation => ({
  id,
  email: `${id}@example.test`,
  role: 'pilot',
  status,
  createdAt,
  expiresAt,
  invitedBy: 'Ada Pennick',
  link: status === 'pending' ? `http://127.0.0.1/invite/${id}` : null,
});

describe("the owner's invitations list", () => {
  it('puts pending invitations first, soonest expiry first, then the rest newest first', () => {
    const list = [
      inv('old-accepted', 'accepted', '2026-11-01T00:00:00Z', '2026-11-08T00:00:00Z'),
      inv('late', 'pending', '2026-11-30T00:00:00Z', '2026-12-07T00:00:00Z'),
      inv('new-revoked', 'revoked', '2026-11-20T00:00:00Z', '2026-11-27T00:00:00Z'),
      inv('soon', 'pending', '2026-11-26T00:00:00Z', '2026-12-03T00:00:00Z'),
    ];
    expect(orderInvitations(list).map((i) => i.id)).toEqual(['soon', 'late', 'new-revoked', 'old-accepted']);
  });

  it('does not mutate the list', () => {
    const list = [inv('b', 'pending', '2026-11-30T00:00:00Z', '2026-12-07T00:00:00Z'), inv('a', 'pending', '2026-11-26T00:00:00Z', '2026-12-03T00:00:00Z')];
    orderInvitations(list);
    expect(list.map((i) => i.id)).toEqual(['b', 'a']);
  });

  it('the form refuses an address without a domain and lower-cases a good one', () => {
    expect(createInvitationSchema.safeParse({ email: 'jory', role: 'pilot' }).success).toBe(false);
    expect(createInvitationSchema.parse({ email: ' Jory.Marsh@Brackenmoor.example ', role: 'pilot' }).email).toBe('jory.marsh@brackenmoor.example');
  });
});
