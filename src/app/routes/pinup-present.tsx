import { Suspense, useCallback, useMemo, useState } from 'react';
import { useQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useNavigate, useParams, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { PIN_CATEGORY_LABELS } from '../../../shared/api/critique.js';
import { ErrorState } from '../../components/ui/error-state.js';
import { ListSkeleton } from '../../components/ui/query-view.js';
import { PageSkeleton } from '../../components/ui/spinner.js';
import { meQueryOptions, useMe } from '../../features/auth/api/get-me.js';
import { revisionPinsQueryOptions } from '../../features/pins/api/get-revision-pins.js';
import { RevisionCritique } from '../compositions/revision-critique.js';
import { pinupQueryOptions, usePinup } from '../../features/pinups/api/get-pinup.js';
import { entryIndexFrom, orderedEntries, PresentationStage, type StagePin } from '../../features/pinups/components/presentation-stage.js';
import { revisionQueryOptions } from '../../features/revisions/api/get-revision.js';
import { studioQueryOptions } from '../../features/studios/api/get-studio.js';
import { useDocumentTitle } from '../../lib/use-document-title.js';
import { parseIdParam } from './route-params.js';

export function makeLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    const pinupId = parseIdParam(params.pinupId, 'pin-up', '/pinups/1/present');
    const pinup = await queryClient.ensureQueryData(pinupQueryOptions(pinupId));
    const entries = orderedEntries(pinup);
    const entry = entries[entryIndexFrom(new URL(request.url).searchParams.get('entry'), entries.length)];
    await Promise.allSettled([
      queryClient.ensureQueryData(meQueryOptions()),
      queryClient.ensureQueryData(studioQueryOptions(pinup.studioId)),
      entry?.latestRevision ? queryClient.ensureQueryData(revisionQueryOptions(entry.latestRevision.id)) : null,
      entry?.latestRevision ? queryClient.ensureQueryData(revisionPinsQueryOptions(entry.latestRevision.id)) : null,
    ]);
    return null;
  };
}

/**
 * Presentation mode: the session full width, one entry at a time in running order, the entry's
 * latest revision with its pins; ← → step entries, ↑ ↓ the open pins, Escape returns to the
 * session page. The entry is kept in the address (`?entry=3`) so a reload stays put.
 */
export function Component() {
  const pinupId = parseIdParam(useParams().pinupId, 'pin-up', '/pinups/1/present');
  const query = usePinup(pinupId);
  if (query.isPending) return <PageSkeleton label="Loading the pin-up…" />;
  if (query.isError) {
    return (
      <main id="main" className="mx-auto max-w-xl px-5 py-10">
        <ErrorState title="The pin-up could not be loaded" error={query.error} onRetry={() => void query.refetch()}>
          <Link to="/">Go to my studios</Link>
        </ErrorState>
      </main>
    );
  }
  return <Presentation pinupId={pinupId} />;
}

function Presentation({ pinupId }: { pinupId: number }) {
  const { data: pinup } = usePinup(pinupId);
  const { data: me } = useMe();
  const studio = useQuery(studioQueryOptions(pinup!.studioId));
  const navigate = useNavigate();
  const [search, setSearch] = useSearchParams();
  const entries = orderedEntries(pinup!);
  const index = entryIndexFrom(search.get('entry'), entries.length);
  const entry = entries[index];
  const revisionId = entry?.latestRevision?.id ?? null;
  useDocumentTitle(`Presenting · ${pinup!.title}`);

  const revision = useQuery({ ...revisionQueryOptions(revisionId ?? 0), enabled: revisionId !== null });
  const pinsQuery = useQuery({ ...revisionPinsQueryOptions(revisionId ?? 0), enabled: revisionId !== null });
  const stagePins = useMemo<StagePin[] | null>(() => {
    if (revisionId === null) return [];
    if (!pinsQuery.data) return null;
    return pinsQuery.data.pins
      .filter((p) => p.state === 'open')
      .sort((a, b) => a.number - b.number)
      .map((p) => ({ id: p.id, number: p.number, label: `${PIN_CATEGORY_LABELS[p.category]} · ${p.anchor.piece}${p.scope === 'orbit' ? ' and its orbit' : ''}` }));
  }, [revisionId, pinsQuery.data]);

  // The pin chosen in the stepper, remembered with its entry so another entry starts on the whole model.
  const [chosen, setChosen] = useState<{ index: number; pinId: number } | null>(null);
  const selectedPinId = chosen && chosen.index === index ? chosen.pinId : null;
  // Where the selected pin is among the open ones the stepper walks (−1: a resolved pin chosen in the list).
  const pinIndex = selectedPinId !== null && stagePins ? stagePins.findIndex((p) => p.id === selectedPinId) : -1;

  const goTo = useCallback(
    (next: number) => {
      if (next < 0 || next >= entries.length) return;
      setSearch((s) => {
        const copy = new URLSearchParams(s);
        copy.set('entry', String(next + 1));
        return copy;
      }, { replace: true });
    },
    [entries.length, setSearch],
  );

  // The stepper's pin is handed to the critique, which flies the model to its view and opens its
  // thread; a pin chosen in the list or on the model moves the stepper too.
  const onSelectedPinChange = useCallback(
    (id: number | null) => setChosen(id === null ? null : { index, pinId: id }),
    [index],
  );

  const viewer = me ? { id: me.id, name: me.name, role: studio.data?.myRole ?? null } : null;

  return (
    <PresentationStage
      pinup={pinup!}
      index={index}
      onIndexChange={goTo}
      pins={stagePins}
      pinIndex={pinIndex >= 0 ? pinIndex : null}
      onPinIndexChange={(i) => setChosen(i === null || !stagePins ? null : { index, pinId: stagePins[i].id })}
      onExit={() => void navigate(`/pinups/${pinup!.id}`)}
    >
      {!entry ? (
        <p className="text-ink-soft">This session has no entries you may see.</p>
      ) : revisionId === null ? (
        <p className="text-ink-soft">{entry.participant.name} has not uploaded a revision yet.</p>
      ) : revision.isPending ? (
        <ListSkeleton label="Loading the revision…" />
      ) : revision.isError ? (
        <ErrorState title="The revision could not be loaded" error={revision.error} onRetry={() => void revision.refetch()} />
      ) : (
        <div className="space-y-3">
          <p className="text-sm text-ink-soft">
            <Link to={`/revisions/${revision.data.id}`}>Open revision {revision.data.number}</Link> to place pins and reply; here the pins are shown for the session.
          </p>
          <Suspense fallback={<ListSkeleton label="Loading the model…" />}>
            <RevisionCritique
              key={revision.data.id}
              revision={revision.data}
              report={revision.data.audit.state === 'done' ? revision.data.audit.report : null}
              readOnly
              viewer={viewer}
              selectedPinId={selectedPinId}
              onSelectedPinChange={onSelectedPinChange}
            />
          </Suspense>
        </div>
      )}
    </PresentationStage>
  );
}
