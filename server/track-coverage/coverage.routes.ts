import multer from 'multer';
import { idParam } from '../../shared/schemas/common';
import { MAX_UPLOAD_BYTES } from '../../shared/limits';
import type { AppDeps } from '../app-deps';
import { heavyWork } from '../http/heavy';
import type { Routes } from '../http/routes';
import { principal } from '../http/session-user';
import { params } from '../http/validate';
import { jobCoverage, measureJobCoverage } from './coverage.service';

// The same size limit as a boundary file's import.
const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: MAX_UPLOAD_BYTES, files: 1, fields: 10, fieldSize: 256 * 1024 },
});

/** A job's track: what it really covered (the owner, and the job's operator). */
export function trackCoverageRoutes(r: Routes, deps: AppDeps): void {
  const tracks = heavyWork(30);
  r.post('/:id/coverage', ['owner', 'operator'], ...tracks, upload.single('file'), async (req, res) => {
    const { id } = params(req, idParam);
    const file = req.file ? { name: req.file.originalname, data: req.file.buffer } : undefined;
    res.status(201).json(await measureJobCoverage(deps, principal(req), id, file));
  });
  r.get('/:id/coverage', ['owner', 'operator'], async (req, res) => {
    const { id } = params(req, idParam);
    res.json(await jobCoverage(deps, principal(req), id));
  });
}
