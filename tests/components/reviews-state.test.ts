import { describe, expect, it } from 'vitest';
import { actionsFrom, type AuditEvent } from '../../contracts/reviews';
import { auditDetail, auditTitle, newestFirst, reviewStateTones, stateLabel } from '../../components/reviews/review-state';

const event = (over: Partial<AuditEvent>): AuditEvent => ({
  id: 'e',
  action: 'review.submitted',
  actor: { id: 'u1', name: 'Tomas Vell' },
  versionId: 'v1',
  versionNumber: 3,
  fromState: 'draft',
  toState: 'in_review',
  comment: null,
  at: '2026-12-01T10:00:00.000Z',
  ...over,
});

describe('review states on screen', () => {
  it('marks only a signed-off version as done, and a returned one as needing attention', () => {
    expect(reviewStateTones.signed_off).toBe('success');
    expect(reviewStateTones.returned).toBe('caution');
    expect(new Set(Object.values(reviewStateTones)).size).toBe(4);
  });

  it('offers the surveyor sign-off and return on a version in review, and the planner nothing there', () => {
    // The role table in the shared domain notes: surveyors review, planners submit.
    expect(actionsFrom('in_review', 'surveyor')).toEqual(['sign-off', 'return']);
    expect(actionsFrom('in_review', 'planner')).toEqual([]);
    expect(actionsFrom('draft', 'planner')).toEqual(['submit']);
    expect(actionsFrom('signed_off', 'owner')).toEqual([]);
  });

  it('names states in our words and passes unknown ones through', () => {
    expect(stateLabel('in_review')).toBe('In review');
    expect(stateLabel('archived')).toBe('archived');
    expect(stateLabel('done')).toBe('Analysed');
    expect(stateLabel(null)).toBeNull();
  });
});

describe('audit trail entries', () => {
  it('titles known actions and turns unknown ones into words', () => {
    expect(auditTitle('review.signed_off')).toBe('Signed off');
    expect(auditTitle('plan.renamed')).toBe('Plan renamed');
  });

  it('says which version, the state change and who', () => {
    expect(auditDetail(event({}))).toBe('Version 3 · Draft → In review · by Tomas Vell');
    expect(auditDetail(event({ actor: null, fromState: null, toState: null, versionNumber: null, action: 'mail.sent' }))).toBe('by Loftline');
  });

  it('lists newest first and keeps the order of entries made at the same instant', () => {
    const a = event({ id: 'a', at: '2026-12-01T10:00:00.000Z' });
    const b = event({ id: 'b', at: '2026-12-01T12:00:00.000Z' });
    const c = event({ id: 'c', at: '2026-12-01T12:00:00.000Z' });
    expect(newestFirst([a, b, c]).map((e) => e.id)).toEqual(['b', 'c', 'a']);
  });

  it('does not mutate the list it sorts', () => {
    const list = [event({ id: 'a', at: '2026-12-01T10:00:00.000Z' }), event({ id: 'b', at: '2026-12-02T10:00:00.000Z' })];
    newestFirst(list);
    expect(list.map((e) => e.id)).toEqual(['a', 'b']);
  });
});
