import type { RequestHandler } from 'express';
import { depsOf } from '../deps';
import { HttpError } from '../lib/http-error';
import { devicePolicy } from '../policy/index';
import { countFailure } from './rate-limit';
import { findDeviceByToken, type DeviceIdentity } from '../services/devices';

declare module 'express-serve-static-core' {
  interface Request {
    device?: DeviceIdentity;
  }
}

const bearer = /^Bearer ([A-Za-z0-9_-]{20,200})$/;

function refused(message: string) {
  return new HttpError(401, 'invalid_device_token', message);
}

/**
 * The device is whoever its bearer token says, and nothing else: no session, no cookie, no device
 * id in the body. A missing, unknown or revoked token answers 401 in the same words.
 */
export const deviceToken: RequestHandler = devicePolicy(async (req, res, next) => {
  res.setHeader('WWW-Authenticate', 'Bearer realm="brinewatch-ingest"');
  const match = bearer.exec(req.headers.authorization ?? '');
  if (!match) {
    await countFailure(req);
    return next(refused('Send the device token as "Authorization: Bearer <token>".'));
  }
  const device = await findDeviceByToken(depsOf(req).db, match[1]!);
  if (!device) {
    await countFailure(req);
    return next(refused('This device token is not valid or has been revoked.'));
  }
  res.removeHeader('WWW-Authenticate');
  req.device = device;
  next();
});
