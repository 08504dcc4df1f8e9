import { idParam } from '../../shared/schemas/common';
import { trackChunkBody } from '../../shared/schemas/phone-track';
import type { AppDeps } from '../app-deps';
import { heavyWork } from '../http/heavy';
import type { Routes } from '../http/routes';
import { principal } from '../http/session-user';
import { body, params } from '../http/validate';
import { measurePhoneTrack, phoneTrack, receiveChunk } from './phone-track.service';

/** The phone track of a job: sent by its operator's phone, read and measured by the owner and the operator. */
export function phoneTrackRoutes(r: Routes, deps: AppDeps): void {
  r.post('/:id/track-points', ['owner', 'operator'], async (req, res) => {
    const { id } = params(req, idParam);
    res.status(201).json(await receiveChunk(deps, principal(req), id, body(req, trackChunkBody)));
  });
  r.get('/:id/track-points', ['owner', 'operator'], async (req, res) => {
    res.json(await phoneTrack(deps, principal(req), params(req, idParam).id));
  });
  r.post('/:id/coverage/from-phone-track', ['owner', 'operator'], ...heavyWork(30), async (req, res) => {
    res.status(201).json(await measurePhoneTrack(deps, principal(req), params(req, idParam).id));
  });
}
