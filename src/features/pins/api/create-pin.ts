import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreatePinBody, Pin, RevisionPins } from '../../../../shared/api/critique.js';
import { api } from '../../../lib/api-client.js';
import { editCachedPins, putPinInCache } from './cache.js';
import { pinKeys } from './keys.js';

/** `POST /api/revisions/:revisionId/pins` (instructor or assigned critic): a new pin with its first comment. */
export function createPin(revisionId: number, body: CreatePinBody): Promise<Pin> {
  return api.post<Pin>(`/api/revisions/${revisionId}/pins`, body);
}

/** Who is placing the pin, for the optimistic entry shown until the server answers. */
export interface PinAuthor {
  readonly id: number;
  readonly name: string;
  readonly role: string;
}

let nextTemporaryId = -1;

/**
 * The pin the list shows at once, before the server answers: a negative id, the next number,
 * the body as its first comment. Replaced by the server's pin (or removed on failure).
 */
export function optimisticPin(data: RevisionPins, revisionId: number, body: CreatePinBody, author: PinAuthor, now = new Date()): Pin {
  const id = nextTemporaryId--;
  const at = now.toISOString();
  const first = data.pins[0];
  return {
    id,
    number: data.pins.reduce((n, p) => Math.max(n, p.number), 0) + 1,
    submissionId: first?.submissionId ?? 0,
    placedOnRevision: { id: revisionId, number: first?.placedOnRevision.id === revisionId ? first.placedOnRevision.number : 0 },
    revisionId,
    anchor: { piece: body.anchor.piece, point: body.anchor.point, side: body.anchor.side },
    scope: body.scope ?? 'piece',
    category: body.category,
    state: 'open',
    camera: body.camera,
    author: { id: author.id, name: author.name },
    createdAt: at,
    updatedAt: at,
    resolvedBy: null,
    outdated: false,
    comments: [{ id, author: { id: author.id, name: author.name, role: author.role }, body: body.body, createdAt: at }],
  };
}

/** Creates a pin; the list shows it at once and takes the server's answer when it comes. */
export function useCreatePin(revisionId: number, author: PinAuthor) {
  const queryClient = useQueryClient();
  const key = pinKeys.list(revisionId);
  return useMutation({
    mutationFn: (body: CreatePinBody) => createPin(revisionId, body),
    onMutate: async (body) => {
      await queryClient.cancelQueries({ queryKey: key });
      const data = queryClient.getQueryData<RevisionPins>(key);
      const temp = data ? optimisticPin(data, revisionId, body, author) : null;
      if (temp) putPinInCache(queryClient, revisionId, temp);
      return { tempId: temp?.id ?? null };
    },
    onError: (_error, _body, context) => {
      const tempId = context?.tempId;
      if (tempId != null) editCachedPins(queryClient, revisionId, (pins) => pins.filter((p) => p.id !== tempId));
    },
    onSuccess: (pin, _body, context) => putPinInCache(queryClient, revisionId, pin, context?.tempId ?? pin.id),
    // Not awaited: the mutation is done when the server answered, the refetch catches up after.
    onSettled: () => {
      void queryClient.invalidateQueries({ queryKey: key });
    },
  });
}
