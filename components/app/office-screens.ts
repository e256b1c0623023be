/** The signed-in screens of planners, surveyors and owners, fetched together when the first of them opens. */
export { OutboxScreen } from '../outbox/outbox-screen';
export { ProfileScreen } from '../profile/profile-screen';
export { ProjectScreen } from '../projects/project-screen';
export { ProjectsScreen } from '../projects/projects-screen';
export { NewPlanScreen, PlanScreen } from '../plans/plan-editor-screen';
export { VersionScreen } from '../results/version-screen';
export { ReportScreen } from '../reports/report-screen';
export { SiteScreen } from '../sites/site-screen';
export { SiteUploadScreen } from '../sites/site-upload-screen';
export { MembersScreen } from '../team/members-screen';
export { TeamsScreen } from '../team/teams-screen';
export { WorkScreen } from '../work/work-screen';
