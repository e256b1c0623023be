/** /api/me, /api/teams and team members. */
import type { Router } from 'express';
import { createTeamSchema, meSchema, memberSchema, membersSchema, teamSummarySchema, updateMemberRoleSchema } from '../../contracts/teams';
import { roleSchema } from '../../contracts/roles';
import { errors } from '../http/errors';
import { teamErrors } from './teams.errors';
import { requireAuth, requireTeam, type Guards } from '../http/guard';
import { parseInput, sendJson } from '../http/validate';
import type { TeamsRepository } from './teams.repository';
import type { TeamSettingsRepository } from './team-settings.repository';
import { teamSettingsSchema, updateTeamSettingsSchema } from '../../contracts/flown-confirmation';

export function registerTeamRoutes(api: Router, deps: { guards: Guards; teams: TeamsRepository; settings: TeamSettingsRepository }) {
  const { guards, teams, settings } = deps;

  // team-wide rules: every member reads them (they say what a version still needs); owners set them
  api.get('/teams/:teamId/settings', guards.permission('team:read'), async (req, res) => {
    const { teamId } = requireTeam(req);
    sendJson(res, teamSettingsSchema, await settings.get(teamId));
  });
  api.patch('/teams/:teamId/settings', guards.permission('member:manage'), async (req, res) => {
    const { teamId, user } = requireTeam(req);
    const body = parseInput(updateTeamSettingsSchema, req.body);
    await settings.set(teamId, user.id, body);
    sendJson(res, teamSettingsSchema, await settings.get(teamId));
  });

  api.get('/me', guards.session(), async (req, res) => {
    const a = requireAuth(req);
    const rows = await teams.teamsOf(a.user.id);
    sendJson(res, meSchema, { user: a.user, teams: rows.map((t) => ({ ...t, role: roleSchema.parse(t.role) })) });
  });

  api.post('/teams', guards.session(), async (req, res) => {
    const a = requireAuth(req);
    const body = parseInput(createTeamSchema, req.body);
    sendJson(res, teamSummarySchema, await teams.createTeam(body.name, a.user.id), 201);
  });

  api.get('/teams/:teamId/members', guards.permission('member:read'), async (req, res) => {
    const { teamId } = requireTeam(req);
    const rows = await teams.members(teamId);
    sendJson(res, membersSchema, {
      members: rows.map((m) => ({ ...m, role: roleSchema.parse(m.role), joinedAt: m.joinedAt.toISOString() })),
    });
  });

  api.patch('/teams/:teamId/members/:memberId', guards.permission('member:manage'), async (req, res) => {
    const { teamId } = requireTeam(req);
    const body = parseInput(updateMemberRoleSchema, req.body);
    const r = await teams.changeMember(teamId, String(req.params.memberId), { role: body.role });
    if (!r.ok) throw r.reason === 'not_found' ? errors.not_found('Member') : lastOwner();
    const updated = (await teams.members(teamId)).find((m) => m.id === req.params.memberId)!;
    sendJson(res, memberSchema, { ...updated, role: roleSchema.parse(updated.role), joinedAt: updated.joinedAt.toISOString() });
  });

  api.delete('/teams/:teamId/members/:memberId', guards.permission('member:manage'), async (req, res) => {
    const { teamId } = requireTeam(req);
    const r = await teams.changeMember(teamId, String(req.params.memberId), { remove: true });
    if (!r.ok) throw r.reason === 'not_found' ? errors.not_found('Member') : lastOwner();
    res.status(204).end();
  });
}

function lastOwner() {
  return teamErrors.last_owner();
}
