/**
 * Every API route's contract, in one list: the OpenAPI document and the role-matrix test are
 * generated from it. A route file under src/pages/api without an entry here fails a test.
 */
import type { ApiSpec } from '../http/spec';
import * as admin from './admin';
import * as authRoutes from './auth';
import * as estimates from './estimates';
import * as factorSets from './factor-sets';
import * as parcels from './parcels';
import * as territory from './territory';
import * as uploads from './uploads';
import * as users from './users';

export const allSpecs: ApiSpec[] = [
  admin.health,
  authRoutes.signIn,
  authRoutes.signOut,
  authRoutes.getSession,
  authRoutes.requestPasswordReset,
  authRoutes.resetPassword,
  admin.openapi,
  users.me,
  users.listUsers,
  users.inviteUser,
  users.updateUser,
  users.reinviteUser,
  users.acceptInvitation,
  admin.listAudit,
  admin.listCapturedMail,
  estimates.createEstimate,
  factorSets.listFactorSets,
  factorSets.getFactorSet,
  factorSets.diffFactorSets,
  factorSets.cloneFactorSet,
  factorSets.startDraft,
  factorSets.editDraft,
  factorSets.publishDraft,
  factorSets.confirmTable,
  factorSets.putDefaultSet,
  territory.getTerritory,
  territory.putTerritory,
  uploads.stageUpload,
  uploads.validateUpload,
  uploads.saveUpload,
  uploads.cancelUpload,
  uploads.searchCrs,
  parcels.getParcel,
  parcels.drawParcel,
  parcels.editBoundary,
  parcels.recordEvent,
  parcels.parcelsForSnapping,
  parcels.searchParcels,
  parcels.mapConfig,
  parcels.tile,
  parcels.listReferenceLayers,
  parcels.publishReferenceLayer,
];
