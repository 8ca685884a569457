import { route, type RouteSpec } from '../lib/routing.js';
import { attachmentHeader, parseFormFields, receiveFile } from '../lib/uploads.js';
import { idParams } from '../shared/common.js';
import {
  measurementCreateBody,
  measurementList,
  measurementOutput,
  MOTOR_FILE_MAX_BYTES,
  motorCreateBody,
  motorDeleteQuery,
  motorExportQuery,
  motorFileList,
  motorFileOutput,
  motorFileParams,
  motorFileUploadBody,
  motorHistoryList,
  motorHistoryQuery,
  motorList,
  motorListQuery,
  motorOutput,
  motorUpdateBody,
} from '../shared/motor.js';
import { EDITORS } from '../shared/roles.js';
import { exportMotors } from './export.js';
import { addMotorFile, listMotorFiles, sendMotorFile } from './files.js';
import { addMeasurement, createMotor, getMotor, listMeasurements, listMotors, motorHistory, retireMotor, updateMotor } from './service.js';

const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

export const motorRoutes: RouteSpec[] = [
  route({
    method: 'get',
    path: '/motors',
    summary: 'The motor register: paged, sorted and filtered',
    tag: 'motors',
    access: 'signed-in',
    query: motorListQuery,
    response: motorList,
    handler: ({ tenant, query }) => listMotors(tenant, query),
  }),
  // Before /motors/:id, which would otherwise take "export" for an id.
  route({
    method: 'get',
    path: '/motors/export',
    summary: 'The register (same filters and sort as the list) as an .xlsx file',
    tag: 'motors',
    access: 'signed-in',
    query: motorExportQuery,
    produces: XLSX_TYPE,
    handler: async ({ tenant, query, res }) => {
      const content = await exportMotors(tenant, query);
      res.setHeader('Content-Type', XLSX_TYPE);
      res.setHeader('Content-Disposition', attachmentHeader(`motor-register-${new Date().toISOString().slice(0, 10)}.xlsx`));
      res.setHeader('X-Content-Type-Options', 'nosniff');
      res.status(200).end(content);
    },
  }),
  route({
    method: 'post',
    path: '/motors',
    summary: 'Add a motor to the register',
    tag: 'motors',
    access: EDITORS,
    body: motorCreateBody,
    response: motorOutput,
    status: 201,
    handler: ({ tenant, body }) => createMotor(tenant, body),
  }),
  route({
    method: 'get',
    path: '/motors/:id',
    summary: 'One motor',
    tag: 'motors',
    access: 'signed-in',
    params: idParams,
    response: motorOutput,
    handler: ({ tenant, params }) => getMotor(tenant, params.id),
  }),
  route({
    method: 'patch',
    path: '/motors/:id',
    summary: 'Edit a motor (send the version you loaded; 409 stale-version if someone else changed it)',
    tag: 'motors',
    access: EDITORS,
    params: idParams,
    body: motorUpdateBody,
    response: motorOutput,
    handler: ({ tenant, params, body }) => updateMotor(tenant, params.id, body),
  }),
  route({
    method: 'delete',
    path: '/motors/:id',
    summary: 'Retire a motor (kept with its history; status retired). ?version=N refuses a stale retire',
    tag: 'motors',
    access: EDITORS,
    params: idParams,
    query: motorDeleteQuery,
    response: motorOutput,
    handler: ({ tenant, params, query }) => retireMotor(tenant, params.id, query.version),
  }),
  route({
    method: 'get',
    path: '/motors/:id/history',
    summary: 'Change history of a motor, newest first',
    tag: 'motors',
    access: 'signed-in',
    params: idParams,
    query: motorHistoryQuery,
    response: motorHistoryList,
    handler: ({ tenant, params, query }) => motorHistory(tenant, params.id, query),
  }),
  route({
    method: 'get',
    path: '/motors/:id/measurements',
    summary: 'Field measurements of a motor, newest first',
    tag: 'motors',
    access: 'signed-in',
    params: idParams,
    response: measurementList,
    handler: ({ tenant, params }) => listMeasurements(tenant, params.id),
  }),
  route({
    method: 'post',
    path: '/motors/:id/measurements',
    summary: 'Record a field measurement (input power, speed, current, voltage)',
    tag: 'motors',
    access: EDITORS,
    params: idParams,
    body: measurementCreateBody,
    response: measurementOutput,
    status: 201,
    handler: ({ tenant, params, body }) => addMeasurement(tenant, params.id, body),
  }),
  route({
    method: 'get',
    path: '/motors/:id/files',
    summary: 'Nameplate photos and documents of a motor',
    tag: 'motors',
    access: 'signed-in',
    params: idParams,
    response: motorFileList,
    handler: ({ tenant, params }) => listMotorFiles(tenant, params.id),
  }),
  route({
    method: 'post',
    path: '/motors/:id/files',
    summary: 'Attach a nameplate photo or a document (multipart: file, kind); JPEG, PNG, WebP or PDF, at most 10 MB',
    tag: 'motors',
    access: EDITORS,
    params: idParams,
    response: motorFileOutput,
    status: 201,
    handler: async ({ tenant, params, req, res }) => {
      const { file, fields } = await receiveFile(req, res, MOTOR_FILE_MAX_BYTES);
      const { kind } = parseFormFields(motorFileUploadBody, fields);
      return addMotorFile(tenant, params.id, file, kind);
    },
  }),
  route({
    method: 'get',
    path: '/motors/:id/files/:fileId',
    summary: 'Download a file of a motor (as an attachment)',
    tag: 'motors',
    access: 'signed-in',
    params: motorFileParams,
    produces: 'application/octet-stream',
    handler: ({ tenant, params, res }) => sendMotorFile(tenant, params.id, params.fileId, res),
  }),
];
