/** The plan editor's logic: the form (mission schema), the drawing synced into it, save, run, and server refusals. */
import { useRouter } from 'expo-router';
import { useEffect, useMemo, useState } from 'react';
import { useForm, type FieldPath } from 'react-hook-form';
import type { Polygon } from 'geojson';
import type { Project } from '../../contracts/projects';
import { can } from '../../contracts/roles';
import { ApiError, errorMessage } from '../api/api-error';
import { hillshadeGeoref } from '../map/image-georef';
import { useAreaDrawing } from '../map/use-area-drawing';
import type { Site } from '../sites/site-shape';
import { useCurrentTeam } from '../team/current-team-context';
import type { Plan } from './plan-shape';
import { formPathOf, planFormDefaults, planFormResolver, type PlanFormIn, type PlanFormOut } from './plan-form-schema';
import { useCreatePlan, useRunPlan, useUpdatePlan } from './plans.queries';

type PlanEditorInput = { project: Project; site: Site; plan: Plan | null };

export function usePlanEditor({ project, site, plan }: PlanEditorInput) {
  const { team, role } = useCurrentTeam();
  const teamId = team?.id ?? '';
  const router = useRouter();
  const mayWrite = can(role, 'plan:write');
  const mayRun = can(role, 'plan:run');
  const [refusal, setRefusal] = useState<string | null>(null);
  const [busy, setBusy] = useState<'save' | 'run' | null>(null);
  const create = useCreatePlan(teamId, project.id);
  const update = useUpdatePlan(teamId);
  const runPlan = useRunPlan(teamId);

  const form = useForm<PlanFormIn, unknown, PlanFormOut>({
    resolver: planFormResolver,
    defaultValues: planFormDefaults(plan?.name ?? `${site.name} plan`, plan?.input),
    mode: 'onTouched',
  });

  const georef = useMemo(() => hillshadeGeoref(site.hillshade, site.metadata.crs.proj4), [site]);
  const saved = plan?.input as { area?: Polygon; takeoff?: { lon: number; lat: number } } | undefined;
  const drawing = useAreaDrawing(georef, saved?.area ?? null, saved?.takeoff ?? null);

  // The drawing is the only editor of the area and takeoff fields: copy each change into the form.
  const { setValue, formState } = form;
  useEffect(() => {
    setValue('mission.area', (drawing.polygon ?? undefined) as never, { shouldValidate: formState.isSubmitted, shouldDirty: true });
  }, [drawing.polygon, setValue, formState.isSubmitted]);
  useEffect(() => {
    setValue('mission.takeoff', (drawing.takeoff ?? undefined) as never, { shouldValidate: formState.isSubmitted, shouldDirty: true });
  }, [drawing.takeoff, setValue, formState.isSubmitted]);

  /** Field problems from the server go beside their fields; anything else into the banner, in the server's words. */
  const showFailure = (e: unknown) => {
    if (e instanceof ApiError && e.fields.length > 0) {
      for (const f of e.fields) form.setError(formPathOf(f.path) as FieldPath<PlanFormIn>, { type: 'server', message: f.message });
    }
    setRefusal(errorMessage(e));
  };

  const persist = async (values: PlanFormOut): Promise<Plan> => {
    const body = { name: values.name, input: values.mission as unknown as Record<string, unknown> };
    if (plan) return update.mutateAsync({ planId: plan.id, change: body });
    return create.mutateAsync({ ...body, siteId: site.id });
  };

  const save = form.handleSubmit(async (values) => {
    setRefusal(null);
    setBusy('save');
    try {
      const p = await persist(values);
      form.reset(form.getValues());
      if (!plan) router.replace(`/projects/${project.id}/plans/${p.id}`);
    } catch (e) {
      showFailure(e);
    } finally {
      setBusy(null);
    }
  });

  const run = form.handleSubmit(async (values) => {
    setRefusal(null);
    setBusy('run');
    try {
      // Always save first (when allowed): the server runs the saved plan, so what is on screen is what gets analysed.
      const p = mayWrite || !plan ? await persist(values) : plan;
      const v = await runPlan.mutateAsync({ planId: p.id });
      router.push(`/projects/${project.id}/plans/${p.id}/versions/${v.id}`);
    } catch (e) {
      showFailure(e);
    } finally {
      setBusy(null);
    }
  });

  const errors = form.formState.errors.mission;
  const areaError = errors?.area
    ? drawing.polygon
      ? (errors.area.message as string | undefined)
      : 'Draw the survey area on the hillshade (tap its corners, then Close area), or import a GeoJSON or KML file.'
    : errors?.takeoff
      ? 'Set the takeoff point: choose "Set takeoff point" and tap the hillshade.'
      : undefined;
  return { form, drawing, georef, mayWrite, mayRun, refusal, busy, save, run, areaError, units: project.units, teamId };
}
