/** The work screen's state: the query, its sections in words, and whether any flight is listed (cautions then show). */
import { useMemo } from 'react';
import { useWorkList } from './work.queries';
import { workSectionsView } from './work-rows';

export function useWorkScreen(teamId: string | undefined) {
  const query = useWorkList(teamId);
  const sections = useMemo(() => (query.data ? workSectionsView(query.data.sections) : []), [query.data]);
  const total = query.data ? sections.reduce((n, s) => n + s.rows.length, 0) : null;
  const hasFlights = sections.some((s) => s.kind === 'flight' && s.rows.length > 0);
  return { query, sections, total, hasFlights };
}
