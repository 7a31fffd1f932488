import { Router } from 'express';
import { z } from 'zod';
import {
  inboxQuery,
  markReadInput,
  messageInput,
  messagePageQuery,
  messagesPerMinute,
} from '@shared/schemas/conversations';
import { photoUploadFields } from '@shared/schemas/photos';
import { tankIdParams } from '@shared/schemas/tanks';
import { created, noContent, route } from '../lib/route';
import { photoUpload } from '../middleware/photo-upload';
import { perActor, rateLimit } from '../middleware/rate-limit';
import { can } from '../policy/index';
import {
  conversationSummary,
  inbox,
  markRead,
  messagePage,
  sendMessage,
  unreadCounts,
  uploadMessagePhoto,
} from '../services/conversations';
import { invalidFields } from '../services/tanks';
import { uploadsPerWindow } from './photos';

/** Mounted under /tanks/:tankId/conversation. */
export const tankConversationRouter = Router({ mergeParams: true });
export const conversationsRouter = Router();

const limitMessages = rateLimit({
  name: 'conversation-message',
  points: messagesPerMinute,
  durationS: 60,
  keyOf: perActor,
  message: (retryAfterS) =>
    `That is ${messagesPerMinute} messages in a minute. Wait ${retryAfterS} seconds, then send again.`,
});

/**
 * The same budget as tank photos (same name, so the same counters): re-encoding costs the same
 * whichever form the photo came through.
 */
const limitUploads = rateLimit({
  name: 'photo-upload',
  ...uploadsPerWindow,
  keyOf: perActor,
  message: (retryAfterS) =>
    `That is ${uploadsPerWindow.points} photos in ${uploadsPerWindow.durationS / 60} minutes. Try again in ${Math.ceil(retryAfterS / 60)} minutes.`,
});

/** A message photo carries its caption at most: it is nobody's cover photo, and of no animal. */
const messagePhotoFields = photoUploadFields.pick({ caption: true });

/**
 * The Idempotency-Key header (IETF draft-ietf-httpapi-idempotency-key-header): a key the client
 * makes for one draft, such as a UUID; visible ASCII only, so it never carries control characters.
 */
const idempotencyKey = z
  .string()
  .regex(/^[\x21-\x7e]{1,200}$/, 'use up to 200 visible ASCII characters, such as a UUID');

function clientKeyOf(header: string | undefined): string | null {
  if (header === undefined) return null;
  const parsed = idempotencyKey.safeParse(header);
  if (!parsed.success) {
    throw invalidFields([{ path: 'headers.idempotency-key', message: parsed.error.issues[0]!.message }]);
  }
  return parsed.data;
}

tankConversationRouter.get(
  '/',
  can('conversations:read'),
  route({ params: tankIdParams }, ({ deps, actor, params }) =>
    conversationSummary(deps.db, actor, params.tankId),
  ),
);
tankConversationRouter.get(
  '/messages',
  can('conversations:read'),
  route({ params: tankIdParams, query: messagePageQuery }, ({ deps, actor, params, query }) =>
    messagePage(deps.db, actor, params.tankId, query),
  ),
);
tankConversationRouter.post(
  '/messages',
  can('conversations:write'),
  limitMessages,
  route({ params: tankIdParams, body: messageInput }, async ({ deps, actor, params, body, header }) => {
    const clientKey = clientKeyOf(header('idempotency-key'));
    const sent = await sendMessage(deps, actor, params.tankId, body, {
      clientKey,
      urgentRequestId: body.urgentRequestId,
    });
    // A retry with the same key gets the stored message, as 200: nothing new was made.
    return sent.created ? created(sent.message) : sent.message;
  }),
);
tankConversationRouter.post(
  '/read',
  can('conversations:read'),
  route({ params: tankIdParams, body: markReadInput }, async ({ deps, actor, params, body }) => {
    await markRead(deps, actor, params.tankId, body.messageId);
    return noContent();
  }),
);
tankConversationRouter.post(
  '/photos',
  can('conversations:write'),
  limitUploads,
  photoUpload,
  route({ params: tankIdParams, body: messagePhotoFields }, async ({ deps, actor, params, body, file }) =>
    created(await uploadMessagePhoto(deps, actor, params.tankId, { bytes: file!.buffer, ...body })),
  ),
);

conversationsRouter.get(
  '/',
  can('conversations:inbox'),
  route({ query: inboxQuery }, ({ deps, actor, query }) => inbox(deps.db, actor, query)),
);
conversationsRouter.get(
  '/unread',
  can('conversations:read'),
  route({}, ({ deps, actor }) => unreadCounts(deps.db, actor)),
);
