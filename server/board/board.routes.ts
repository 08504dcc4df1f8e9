import { idParam } from '../../shared/schemas/common';
import {
  assignmentCreateBody,
  assignmentPatchBody,
  boardDateParam,
  boardOrderBody,
  boardQuery,
  publishBody,
} from '../../shared/schemas/board';
import type { AppDeps } from '../app-deps';
import type { Routes } from '../http/routes';
import { principal } from '../http/session-user';
import { body, params, query } from '../http/validate';
import { BoardCache } from './board-cache';
import * as board from './board.service';
import { sendReading } from '../http/json-reading';
import { versionOf } from './board-version';
import { publishBoard } from './publish.service';

/** The work board is the owner's: operators use their run sheet, viewers the season reports. */
export function boardRoutes(r: Routes, deps: AppDeps): void {
  const boards = new BoardCache(deps.db, deps.config.publicUrl, undefined, {
    onWeatherError: (err) => deps.logger?.warn({ error: err instanceof Error ? err.message : String(err) }, 'board weather not read'),
  });
  r.get('/', ['owner'], async (req, res) => {
    const by = principal(req);
    const reading = await boards.read(by.farmId, query(req, boardQuery).date, by.farmRevision);
    sendReading(req, res, reading);
  });
  r.post('/:date/order', ['owner'], async (req, res) => {
    const { date } = params(req, boardDateParam);
    const b = body(req, boardOrderBody);
    res.json(await board.reorderBoard(deps, principal(req), date, { ...b, version: versionOf(req, b.version) }));
  });
  r.post('/:date/publish', ['owner'], async (req, res) => {
    const { date } = params(req, boardDateParam);
    res.json(await publishBoard(deps, principal(req), date, versionOf(req, body(req, publishBody).version)));
  });
}

export function assignmentRoutes(r: Routes, deps: AppDeps): void {
  r.post('/', ['owner'], async (req, res) => {
    const b = body(req, assignmentCreateBody);
    res.status(201).json(await board.createAssignment(deps, principal(req), { ...b, version: versionOf(req, b.version) }));
  });
  r.patch('/:id', ['owner'], async (req, res) => {
    const { id } = params(req, idParam);
    const b = body(req, assignmentPatchBody);
    res.json(await board.updateAssignment(deps, principal(req), id, { ...b, version: versionOf(req, b.version) }));
  });
  r.delete('/:id', ['owner'], async (req, res) => {
    const { id } = params(req, idParam);
    res.json(await board.deleteAssignment(deps, principal(req), id, versionOf(req)));
  });
}
