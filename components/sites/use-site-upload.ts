/** The upload form's state: the chosen file, the fields (checked by zod), the upload and its progress, the refusal. */
import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'expo-router';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { errorMessage } from '../api/api-error';
import { useCurrentTeam } from '../team/current-team-context';
import { surfaceKinds } from './site-shape';
import { DuplicateSiteError, useUploadSite } from './sites.queries';
import { noFileMessage } from './site-upload-words';

/** Vertical datums offered as one tap; anything else is typed in. */
export const datumPresets = ['EGM96 geoid (EPSG:5773)', 'EGM2008 geoid (EPSG:3855)', 'WGS 84 ellipsoid'] as const;
/** The datum value meaning "as the file's GeoKeys declare it" (sent as no datum; the server refuses when the file has none). */
export const datumFromFile = 'from-file';

const siteUploadFormSchema = z.object({
  name: z.string().trim().min(2, 'Name the grid (at least 2 characters).').max(120, 'Keep the name under 120 characters.'),
  surfaceKind: z.enum(surfaceKinds, { error: 'Say whether the grid is bare earth or a surface model.' }),
  verticalDatum: z.string().trim().min(2, 'Say which vertical datum the heights refer to.').max(80, 'Keep the datum under 80 characters.'),
});
type SiteUploadForm = z.infer<typeof siteUploadFormSchema>;

/** Browsers report GeoTIFFs under several types, so the file name decides what the picker offers. */
export const geotiffAccept = '.tif,.tiff,image/tiff,image/geotiff';

/** The name a grid gets from its file name ("upper-field_2m.tif" -> "upper-field 2m"). */
function nameFromFile(fileName: string): string {
  return fileName.replace(/\.[^.]+$/, '').replace(/[_]+/g, ' ').trim().slice(0, 120);
}

export function useSiteUpload(projectId: string) {
  const { team } = useCurrentTeam();
  const router = useRouter();
  const upload = useUploadSite(team?.id ?? '', projectId);
  const [file, setFile] = useState<File | null>(null);
  const [fileError, setFileError] = useState<string | null>(null);
  const [refusal, setRefusal] = useState<string | null>(null);
  const [duplicateOf, setDuplicateOf] = useState<string | null>(null);
  const form = useForm<SiteUploadForm>({
    resolver: zodResolver(siteUploadFormSchema),
    defaultValues: { name: '', surfaceKind: undefined as unknown as SiteUploadForm['surfaceKind'], verticalDatum: datumPresets[0] },
  });

  const pick = (f: File) => {
    setFile(f);
    setFileError(null);
    setRefusal(null);
    // Follow the file with the name until the planner types one of their own.
    const current = form.getValues('name');
    if (!current || (file && current === nameFromFile(file.name))) form.setValue('name', nameFromFile(f.name), { shouldValidate: true });
  };

  const submitFields = form.handleSubmit(async (fields) => {
    setRefusal(null);
    setDuplicateOf(null);
    if (!file) return;
    try {
      const site = await upload.mutateAsync({ file, fields: { ...fields, verticalDatum: fields.verticalDatum === datumFromFile ? null : fields.verticalDatum } });
      router.replace(`/projects/${projectId}/sites/${site.id}`);
    } catch (e) {
      if ((e as Error).name === 'AbortError') return;
      setRefusal(errorMessage(e)); // the engine's reason, word for word
      setDuplicateOf(e instanceof DuplicateSiteError ? e.existingSiteId : null);
    }
  });

  /** The missing file is named at once, beside the field messages, not only after every field is right. */
  const submit = async () => {
    if (!file) setFileError(noFileMessage);
    await submitFields();
  };

  return { form, file, fileError, pick, submit, refusal, duplicateOf, progress: upload.progress, busy: upload.isPending };
}
