/**
 * The Intake: spreadsheet imports as batches. Upload → parse (worker) → map → validate every cell →
 * preview (staging rows in `import_rows`) → commit (one transaction) → undo.
 *
 * Commit policy: the rows without errors are committed together in one transaction — all of them or
 * none (a failure anywhere rolls everything back and the batch reads `failed` with the reason; it can
 * be committed again). Rows with errors are skipped and stay listed in the batch. Re-importing a tag
 * of the site updates that motor. The commit runs in the request, in-process, and writes its progress
 * to the batch row outside its transaction, so a reloaded page polling `GET /api/imports/:id` sees
 * `committing` and the progress, and the commit carries on if the browser goes away.
 *
 * Undo restores every motor the batch updated to its values before the commit (kept in the staging
 * rows) and removes the motors it created, in one transaction; it is refused (409) when one of those
 * motors was changed since, or has measurements or files, so undo never loses later work.
 */
import { Op, QueryTypes, literal, type Transaction } from 'sequelize';
import type { z } from 'zod';
import { database, isDatabaseUnavailable } from '../lib/database.js';
import { AppError, conflict, notFound, unavailable } from '../lib/errors.js';
import { orderFrom, pageWindow } from '../lib/lists.js';
import type { Tenant } from '../lib/tenant.js';
import { storeFile, safeFileName } from '../lib/uploads.js';
import { ImportBatch, ImportMapping, ImportRow, Motor, MotorFile, MotorMeasurement, Site, User } from '../models/index.js';
import type { ListResult } from '../shared/common.js';
import {
  IMPORT_LIMITS,
  type ImportBatchSummary,
  type ImportCommitResult,
  type ImportDetail,
  type ImportMapping as Mapping,
  type ImportPreviewResult,
  type RowIssue,
  type importDetailQuery,
  type importListQuery,
} from '../shared/intake.js';
import { buildMapping, findHeaderRow, headerKey, headerNames } from './mapping.js';
import { parseSpreadsheet } from './parse.js';
import { chunked, commitStatements, insertAudits, insertRows, overwriteMotors } from './store.js';
import { startValidation, type ParsedRow, type ValidatedRow, type Validation } from './validate.js';

/**
 * Test-only hooks (honoured only when NODE_ENV is `test`): `afterCommitStep` may throw to simulate a
 * failure in the middle of a commit, after its set-based step `stepIndex` (0 creates the outcome table,
 * 1 locks the updated motors, 2 updates them, 3 creates the new ones, 4 records row outcomes, 5 audits).
 */
export const intakeTestHooks: { afterCommitStep?: (stepIndex: number) => void } = {};

async function rememberedMappings(tenant: Tenant): Promise<Map<string, string | null>> {
  const rows = await tenant.findAll(ImportMapping, { attributes: ['headerKey', 'field', 'organizationId'] });
  return new Map(rows.map((row) => [row.headerKey, row.field]));
}

async function rememberMapping(tenant: Tenant, mapping: Mapping, transaction?: Transaction): Promise<void> {
  const entries = Object.entries(mapping)
    .map(([header, field]) => ({ headerKey: headerKey(header), field }))
    .filter((entry) => entry.headerKey !== '' && !/^column [a-z]+$/.test(entry.headerKey));
  if (entries.length === 0) return;
  await ImportMapping.bulkCreate(
    entries.map((entry) => ({ organizationId: tenant.organizationId, headerKey: entry.headerKey, field: entry.field })),
    { updateOnDuplicate: ['field', 'updatedAt'], conflictAttributes: ['organizationId', 'headerKey'], ...(transaction ? { transaction } : {}) },
  );
}

async function existingTags(siteId: number, tags: string[]): Promise<Map<string, number>> {
  if (tags.length === 0) return new Map();
  const rows = await database().query<{ id: number; tag: string }>('SELECT id, tag FROM motors WHERE site_id = $1 AND tag = ANY($2::text[])', {
    bind: [siteId, tags],
    type: QueryTypes.SELECT,
  });
  return new Map(rows.map((row) => [row.tag, row.id]));
}

function tagsOf(rows: ParsedRow[], headers: string[], mapping: Mapping): string[] {
  const index = headers.findIndex((header) => mapping[header] === 'tag');
  if (index < 0) return [];
  const tags = new Set<string>();
  for (const row of rows) {
    const cell = row.cells[index];
    if (cell !== null && cell !== undefined) tags.add(String(cell).replace(/\s+/g, ' ').trim());
  }
  return [...tags];
}

async function validateBatch(tenant: Tenant, site: Site, headers: string[], mapping: Mapping, rows: ParsedRow[]): Promise<Validation> {
  const existing = await existingTags(site.id, tagsOf(rows, headers, mapping));
  return startValidation(rows, {
    headers,
    mapping,
    site: { voltageV: site.voltageV, frequencyHz: site.frequencyHz },
    existing,
    currentYear: new Date().getFullYear(),
  });
}

/** The batch's rows validated chunk by chunk as the staging asks for them. */
function* validatedChunks(validation: Validation, rows: ParsedRow[]): Generator<ValidatedRow[]> {
  for (const chunk of chunked(rows)) yield validation.validate(chunk);
}

async function requireSite(tenant: Tenant, siteId: number): Promise<Site> {
  const site = await Site.findOne({ where: tenant.where<Site>({ id: siteId }) });
  if (!site) throw new AppError('invalid-input', 'siteId: no such site', 400, [{ field: 'siteId', message: 'no such site' }]);
  return site;
}

export async function createImport(
  tenant: Tenant,
  upload: { buffer: Buffer; originalname: string },
  input: { siteId: number; mapping?: Mapping | undefined },
): Promise<ImportPreviewResult> {
  const site = await requireSite(tenant, input.siteId);
  const sheet = await parseSpreadsheet(upload.buffer);
  const headerIndex = findHeaderRow(sheet.rows.map((row) => row.cells));
  const headerRow = sheet.rows[headerIndex];
  if (!headerRow) throw new AppError('unreadable-file', 'The sheet has no header row.', 400);
  const headers = headerNames(headerRow.cells);
  const dataRows = sheet.rows.slice(headerIndex + 1);
  if (dataRows.length > IMPORT_LIMITS.maxRows) {
    throw new AppError('too-large', `The sheet has ${dataRows.length} data rows; at most ${IMPORT_LIMITS.maxRows} can be imported at once. Split the file.`, 413);
  }
  if (input.mapping) {
    const unknown = Object.keys(input.mapping).filter((header) => !headers.includes(header));
    if (unknown.length > 0) {
      throw new AppError('invalid-input', `mapping: the file has no column "${unknown[0]}"`, 400, unknown.map((header) => ({ field: 'mapping', message: `no column "${header}"` })));
    }
  }
  const mapping = buildMapping(headers, await rememberedMappings(tenant), input.mapping);
  const validation = await validateBatch(tenant, site, headers, mapping, dataRows);
  const stored = await storeFile(upload.buffer);
  const batchId = await database().transaction(async (transaction) => {
    const batch = await tenant.create(
      ImportBatch,
      {
        siteId: site.id,
        userId: tenant.user.id,
        fileName: safeFileName(upload.originalname, 'import.xlsx'),
        fileKey: stored.key,
        fileSizeBytes: stored.sizeBytes,
        status: 'previewed',
        mapping,
        headers,
        headerRow: headerRow.row,
        sheetName: sheet.sheetName,
        // Counted while the rows are validated and staged, then written below.
        totalRows: 0,
        validRows: 0,
        invalidRows: 0,
        warningRows: 0,
        duplicates: { inFile: [], inRegister: [] },
      },
      transaction,
    );
    await insertRows(batch.id, validatedChunks(validation, dataRows), transaction);
    const { counts, duplicates } = validation.summary();
    await ImportBatch.update(
      { totalRows: counts.total, validRows: counts.valid, invalidRows: counts.invalid, warningRows: counts.warnings, duplicates },
      { where: { id: batch.id }, transaction },
    );
    if (input.mapping) await rememberMapping(tenant, mapping, transaction);
    await tenant.audit('upload', 'import', batch.id, { fileName: batch.fileName, siteId: site.id, rows: counts }, transaction);
    return batch.id;
  });
  return previewResult(tenant, batchId, validation.unmappedRequired);
}

export async function remapImport(tenant: Tenant, id: number, mapping: Mapping): Promise<ImportPreviewResult> {
  const batch = await tenant.findById(ImportBatch, id, 'Import');
  if (batch.status !== 'previewed' && batch.status !== 'failed') {
    throw conflict('not-editable', `This import is ${batch.status}; only a preview can be re-mapped.`);
  }
  const unknown = Object.keys(mapping).filter((header) => !batch.headers.includes(header));
  if (unknown.length > 0) throw new AppError('invalid-input', `mapping: the file has no column "${unknown[0]}"`, 400);
  const full = buildMapping(batch.headers, new Map(), mapping);
  const site = await requireSite(tenant, batch.siteId);
  const stored = await ImportRow.findAll({ where: { batchId: id }, attributes: ['rowNumber', 'cells'], order: [['rowNumber', 'ASC']], raw: true });
  const rows: ParsedRow[] = stored.map((row) => ({ row: row.rowNumber, cells: row.cells }));
  const validation = await validateBatch(tenant, site, batch.headers, full, rows);
  await database().transaction(async (transaction) => {
    // Takes the batch's row first, so a commit that claims it meanwhile is seen here (and refused).
    const [claimed] = await ImportBatch.update(
      { mapping: full },
      { where: tenant.where<ImportBatch>({ id, status: { [Op.in]: ['previewed', 'failed'] } }), transaction },
    );
    if (claimed === 0) throw conflict('not-editable', 'This import changed meanwhile; reload it.');
    await ImportRow.destroy({ where: { batchId: id }, transaction });
    await insertRows(id, validatedChunks(validation, rows), transaction);
    const { counts, duplicates } = validation.summary();
    await ImportBatch.update(
      { totalRows: counts.total, validRows: counts.valid, invalidRows: counts.invalid, warningRows: counts.warnings, duplicates },
      { where: { id }, transaction },
    );
    await rememberMapping(tenant, full, transaction);
    await tenant.audit('remap', 'import', id, { mapping: full }, transaction);
  });
  return previewResult(tenant, id, validation.unmappedRequired);
}

async function summaries(tenant: Tenant, batches: ImportBatch[]): Promise<ImportBatchSummary[]> {
  const siteIds = [...new Set(batches.map((batch) => batch.siteId))];
  const userIds = [...new Set(batches.map((batch) => batch.userId).filter((userId): userId is number => userId !== null))];
  const [sites, users] = await Promise.all([
    siteIds.length > 0 ? tenant.findAll(Site, { where: { id: { [Op.in]: siteIds } }, attributes: ['id', 'name', 'organizationId'] }) : [],
    userIds.length > 0 ? User.findAll({ where: { id: { [Op.in]: userIds }, organizationId: tenant.organizationId }, attributes: ['id', 'name'] }) : [],
  ]);
  const siteNames = new Map(sites.map((site) => [site.id, site.name]));
  const userNames = new Map(users.map((user) => [user.id, user.name]));
  return batches.map((batch) => ({
    id: batch.id,
    siteId: batch.siteId,
    siteName: siteNames.get(batch.siteId) ?? '',
    fileName: batch.fileName,
    fileSizeBytes: batch.fileSizeBytes,
    status: batch.status,
    progress: batch.progress,
    userId: batch.userId,
    userName: batch.userId === null ? null : (userNames.get(batch.userId) ?? null),
    rows: { total: batch.totalRows, valid: batch.validRows, invalid: batch.invalidRows, warnings: batch.warningRows },
    createdCount: batch.createdCount,
    updatedCount: batch.updatedCount,
    failure: batch.failure,
    createdAt: batch.createdAt.toISOString(),
    committedAt: batch.committedAt ? batch.committedAt.toISOString() : null,
    undoneAt: batch.undoneAt ? batch.undoneAt.toISOString() : null,
  }));
}

async function firstIssues(batchId: number, column: 'errors' | 'warnings'): Promise<RowIssue[]> {
  const rows = await database().query<{ issue: RowIssue }>(
    `SELECT issue FROM import_rows, jsonb_array_elements(import_rows.${column}) AS issue
     WHERE batch_id = $1 AND jsonb_array_length(import_rows.${column}) > 0
     ORDER BY row_number LIMIT $2`,
    { bind: [batchId, IMPORT_LIMITS.maxIssuesListed], type: QueryTypes.SELECT },
  );
  return rows.map((row) => row.issue);
}

const REQUIRED_FOR_CREATE = ['tag', 'ratedPowerKw'];

async function previewResult(tenant: Tenant, id: number, unmappedRequired?: string[]): Promise<ImportPreviewResult> {
  const batch = await tenant.findById(ImportBatch, id, 'Import');
  const [summary] = await summaries(tenant, [batch]);
  const mappedFields = new Set(Object.values(batch.mapping));
  const missing =
    unmappedRequired ??
    [...REQUIRED_FOR_CREATE.filter((field) => !mappedFields.has(field)), ...(!mappedFields.has('poles') && !mappedFields.has('speedRpm') ? ['poles'] : [])];
  return {
    ...(summary as ImportBatchSummary),
    headers: batch.headers,
    headerRow: batch.headerRow,
    sheetName: batch.sheetName,
    mapping: batch.mapping as Mapping,
    unmappedRequired: missing,
    errors: await firstIssues(id, 'errors'),
    warnings: await firstIssues(id, 'warnings'),
    duplicates: batch.duplicates,
  };
}

export async function getImport(tenant: Tenant, id: number, query: z.infer<typeof importDetailQuery>): Promise<ImportDetail> {
  const result = await previewResult(tenant, id);
  const where: Record<string, unknown> = { batchId: id };
  if (query.filter === 'valid') where.valid = true;
  if (query.filter === 'invalid') where.valid = false;
  const warningFilter = query.filter === 'warning' ? { [Op.and]: [literal('jsonb_array_length(warnings) > 0')] } : {};
  const { rows, count } = await ImportRow.findAndCountAll({
    where: { ...where, ...warningFilter },
    order: [['rowNumber', 'ASC']],
    ...pageWindow(query.page, query.pageSize),
  });
  return {
    ...result,
    preview: {
      items: rows.map((row) => ({
        row: row.rowNumber,
        action: row.action,
        motorId: row.motorId,
        values: row.values,
        cells: Object.fromEntries(result.headers.map((header, index) => [header, row.cells[index] ?? null])),
        errors: row.errors,
        warnings: row.warnings,
      })),
      total: count,
      page: query.page,
      pageSize: query.pageSize,
    },
  };
}

export async function listImports(tenant: Tenant, query: z.infer<typeof importListQuery>): Promise<ListResult<ImportBatchSummary>> {
  const where: Record<string, unknown> = {};
  if (query.siteId !== undefined) where.siteId = query.siteId;
  if (query.status !== undefined) where.status = query.status;
  const { rows, count } = await tenant.findAndCountAll(ImportBatch, { where, order: orderFrom(query.sort), ...pageWindow(query.page, query.pageSize) });
  return { items: await summaries(tenant, rows), total: count, page: query.page, pageSize: query.pageSize };
}

async function setProgress(id: number, progress: number): Promise<void> {
  await database().query('UPDATE import_batches SET progress = $1 WHERE id = $2', { bind: [progress, id], type: QueryTypes.UPDATE });
}

/** Advisory-lock namespace of import commits (business cases lock on a positive organisation id). */
const COMMIT_LOCK_NAMESPACE = -1;
const INTERRUPTED_COMMIT = 'The commit was interrupted (the server or its database stopped); nothing was written. Commit again.';

/**
 * Marks as failed (committable again) every batch left `committing` by a commit that no longer runs:
 * its process died or its database restarted. A running commit holds its batch's advisory lock from
 * before the claim to the end of its transaction, in whichever instance runs it, so a free lock means
 * an interrupted commit. Called by the start command. Answers the batch ids.
 */
export async function recoverInterruptedCommits(): Promise<number[]> {
  const rows = await database().query<{ id: number }>(
    `WITH committing AS MATERIALIZED (SELECT id FROM import_batches WHERE status = 'committing')
     UPDATE import_batches SET status = 'failed', progress = 0, failure = :failure, updated_at = now()
     WHERE id IN (SELECT id FROM committing WHERE pg_try_advisory_xact_lock(:namespace, id)) AND status = 'committing'
     RETURNING id`,
    { replacements: { failure: INTERRUPTED_COMMIT, namespace: COMMIT_LOCK_NAMESPACE }, type: QueryTypes.SELECT },
  );
  return rows.map((row) => row.id);
}

export async function commitImport(tenant: Tenant, id: number): Promise<ImportCommitResult> {
  const batch = await tenant.findById(ImportBatch, id, 'Import');
  // The transaction takes the batch's lock before the claim, so while the batch reads `committing` its
  // lock is held; a `committing` batch whose lock is free was interrupted and may be claimed again.
  const transaction = await database().transaction();
  try {
    const [lock] = await database().query<{ locked: boolean }>('SELECT pg_try_advisory_xact_lock(:namespace, :id) AS locked', {
      replacements: { namespace: COMMIT_LOCK_NAMESPACE, id },
      type: QueryTypes.SELECT,
      transaction,
    });
    if (!lock?.locked) throw conflict('not-committable', 'This import is being committed; wait for the commit to finish.');
    // Claim the batch outside the transaction, so a second commit is refused and pollers see it.
    const [, claimed] = await ImportBatch.update(
      { status: 'committing', progress: 0, failure: null },
      { where: tenant.where<ImportBatch>({ id, status: { [Op.in]: ['previewed', 'failed', 'committing'] } }), returning: true },
    );
    if (claimed.length === 0) throw conflict('not-committable', `This import is ${batch.status}; only a preview can be committed.`);
  } catch (error) {
    await transaction.rollback().catch(() => undefined);
    throw error;
  }
  try {
    const result = await (async () => {
      const site = await Site.findOne({ where: tenant.where<Site>({ id: batch.siteId }), transaction, lock: transaction.LOCK.SHARE });
      if (!site) throw notFound('Site');
      const replacements = {
        batchId: id,
        siteId: site.id,
        organizationId: tenant.organizationId,
        userId: tenant.user.id,
        siteVoltageV: site.voltageV,
        siteFrequencyHz: site.frequencyHz,
      };
      const run = async <T extends object = Record<string, unknown>>(sql: string) =>
        database().query<T>(sql, { replacements, transaction, type: QueryTypes.SELECT });
      const [valid] = await run<{ count: number }>(commitStatements.count);
      const validRows = valid?.count ?? 0;
      if (validRows === 0) throw conflict('nothing-to-commit', 'No row of this import is valid: correct the file or the mapping first.');
      // Set-based steps; the progress row (outside the transaction) advances after each one.
      const steps = [
        [commitStatements.outcomes, 0.02],
        [commitStatements.lockUpdated, 0.15],
        [commitStatements.updateMotors, 0.35],
        [commitStatements.insertMotors, 0.7],
        [commitStatements.recordOutcomes, 0.85],
        [commitStatements.insertAudits, 0.99],
      ] as const;
      for (const [index, [sql, progress]] of steps.entries()) {
        await run(sql);
        if (process.env.NODE_ENV === 'test') intakeTestHooks.afterCommitStep?.(index);
        await setProgress(id, progress);
      }
      const [outcome] = await run<{ created: number; updated: number }>(
        `SELECT count(*) FILTER (WHERE action = 'create')::int AS created, count(*) FILTER (WHERE action = 'update')::int AS updated FROM import_commit_outcomes`,
      );
      const created = outcome?.created ?? 0;
      const updated = outcome?.updated ?? 0;
      await ImportBatch.update(
        { status: 'committed', progress: 1, createdCount: created, updatedCount: updated, committedAt: new Date(), failure: null },
        { where: { id }, transaction },
      );
      await rememberMapping(tenant, batch.mapping as Mapping, transaction);
      await tenant.audit('commit', 'import', id, { created, updated, skipped: batch.invalidRows }, transaction);
      return { created, updated, skipped: batch.totalRows - validRows };
    })();
    await transaction.commit();
    return result;
  } catch (error) {
    // Rolls back unless the commit itself failed (then the transaction is already over).
    if (!(transaction as unknown as { finished?: string }).finished) await transaction.rollback().catch(() => undefined);
    const lostDatabase = isDatabaseUnavailable(error);
    const message = error instanceof AppError ? error.message : lostDatabase ? INTERRUPTED_COMMIT : 'The commit failed; nothing was written.';
    try {
      await ImportBatch.update({ status: error instanceof AppError && error.code === 'nothing-to-commit' ? 'previewed' : 'failed', progress: 0, failure: message }, { where: { id } });
    } catch (markError) {
      // The database is gone: the batch stays `committing` without its lock, which the next commit or start takes back.
      if (!isDatabaseUnavailable(markError)) throw markError;
    }
    if (error instanceof AppError) throw error;
    if (lostDatabase) throw unavailable('The database stopped answering during the commit; nothing was written. Commit again once it is back.');
    throw new AppError('commit-failed', `The commit failed and nothing was written (${error instanceof Error ? error.message.slice(0, 200) : 'unknown error'}). Try again.`, 500);
  }
}

export async function undoImport(tenant: Tenant, id: number): Promise<{ removed: number; restored: number; status: 'undone' }> {
  return database().transaction(async (transaction) => {
    const batch = await tenant.findById(ImportBatch, id, 'Import', { transaction, lock: transaction.LOCK.UPDATE });
    if (batch.status === 'previewed' || batch.status === 'failed') {
      await batch.update({ status: 'undone', undoneAt: new Date() }, { transaction });
      await tenant.audit('discard', 'import', id, null, transaction);
      return { removed: 0, restored: 0, status: 'undone' };
    }
    if (batch.status !== 'committed') throw conflict('not-undoable', `This import is ${batch.status}; only a committed import can be undone.`);
    const rows = await ImportRow.findAll({
      where: { batchId: id, action: { [Op.in]: ['create', 'update'] }, motorId: { [Op.ne]: null } },
      attributes: ['rowNumber', 'action', 'motorId', 'previousValues'],
      transaction,
      raw: true,
    });
    const ids = rows.map((row) => row.motorId as number);
    const motors = await Motor.findAll({ where: { id: { [Op.in]: ids }, organizationId: tenant.organizationId }, attributes: ['id', 'tag', 'version'], transaction, lock: transaction.LOCK.UPDATE });
    const current = new Map(motors.map((motor) => [motor.id, motor]));
    const createdIds = rows.filter((row) => row.action === 'create').map((row) => row.motorId as number);
    const [measured, filed] = await Promise.all([
      MotorMeasurement.findAll({ where: { motorId: { [Op.in]: createdIds } }, attributes: ['motorId'], transaction, raw: true }),
      MotorFile.findAll({ where: { motorId: { [Op.in]: createdIds } }, attributes: ['motorId'], transaction, raw: true }),
    ]);
    const withRecords = new Set([...measured, ...filed].map((record) => record.motorId));
    const changed: string[] = [];
    for (const row of rows) {
      const motor = current.get(row.motorId as number);
      if (row.action === 'create') {
        if (motor && (motor.version !== 0 || withRecords.has(motor.id))) changed.push(motor.tag);
      } else {
        const before = row.previousValues as { version: number; tag: string } | null;
        if (!motor || !before || motor.version !== before.version + 1) changed.push(motor?.tag ?? before?.tag ?? `row ${row.rowNumber}`);
      }
    }
    if (changed.length > 0) {
      throw conflict(
        'changed-since-import',
        `${changed.length} motor(s) of this import were changed since (${changed.slice(0, 5).join(', ')}${changed.length > 5 ? '…' : ''}); undoing would lose those changes.`,
        changed.map((tag) => ({ field: 'tag', message: tag })),
      );
    }
    const existingCreated = createdIds.filter((motorId) => current.has(motorId));
    if (existingCreated.length > 0) await Motor.destroy({ where: { id: { [Op.in]: existingCreated }, organizationId: tenant.organizationId }, transaction });
    const restores = rows.filter((row) => row.action === 'update').map((row) => row.previousValues as Record<string, unknown>);
    for (const chunk of chunked(restores)) await overwriteMotors(chunk, transaction);
    await insertAudits(
      tenant.organizationId,
      tenant.user.id,
      [
        ...existingCreated.map((motorId) => ({ action: 'import-undo-remove', entity_id: motorId, changes: { importBatchId: id } })),
        ...restores.map((values) => ({ action: 'import-undo-restore', entity_id: values.id as number, changes: { importBatchId: id } })),
      ],
      transaction,
    );
    await batch.update({ status: 'undone', undoneAt: new Date() }, { transaction });
    await tenant.audit('undo', 'import', id, { removed: existingCreated.length, restored: restores.length }, transaction);
    return { removed: existingCreated.length, restored: restores.length, status: 'undone' };
  });
}
