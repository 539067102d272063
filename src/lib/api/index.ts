/**
 * Every API route's contract, in one list: the OpenAPI document and the role-matrix test are
 * generated from it. A route file under src/pages/api without an entry here fails a test.
 */
import type { ApiSpec } from '../http/spec';
import * as admin from './admin';
import * as assessments from './assessments';
import * as authRoutes from './auth';
import * as board from './board';
import * as boardPack from './board-pack';
import * as dashboard from './dashboard';
import * as estimates from './estimates';
import * as factorSets from './factor-sets';
import * as followUps from './follow-ups';
import * as jobs from './jobs';
import * as parcels from './parcels';
import * as proposals from './proposals';
import * as regions from './regions';
import * as screening from './screening';
import * as register from './register';
import * as ruleSets from './rule-sets';
import * as territory from './territory';
import * as uploads from './uploads';
import * as users from './users';

export const allSpecs: ApiSpec[] = [
  admin.health,
  admin.ready,
  authRoutes.signIn,
  authRoutes.signOut,
  authRoutes.getSession,
  authRoutes.requestPasswordReset,
  authRoutes.resetPassword,
  authRoutes.resetPasswordLink,
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
  uploads.uploadReportCsv,
  uploads.cancelUpload,
  uploads.uploadStatus,
  uploads.searchCrs,
  parcels.getParcel,
  parcels.drawParcel,
  parcels.editBoundary,
  parcels.recordEvent,
  parcels.parcelsForSnapping,
  parcels.searchParcels,
  parcels.mapConfig,
  parcels.uploadOnMap,
  parcels.tile,
  parcels.listReferenceLayers,
  parcels.publishReferenceLayer,
  proposals.createProposal,
  proposals.listProposals,
  proposals.getProposal,
  proposals.updateProposal,
  proposals.transitionProposal,
  proposals.addAttachment,
  proposals.getAttachment,
  assessments.runAssessment,
  assessments.listAssessments,
  assessments.getAssessment,
  assessments.saveFindings,
  assessments.signOffAssessment,
  assessments.reproduceAssessment,
  screening.listScreening,
  screening.recomputeScreening,
  ruleSets.listRuleSets,
  ruleSets.getRuleSet,
  ruleSets.diffRuleSets,
  ruleSets.cloneRuleSet,
  ruleSets.startRuleDraft,
  ruleSets.editRuleDraft,
  ruleSets.publishRuleDraft,
  ruleSets.putDefaultRuleSet,
  regions.listRegions,
  regions.enterReferenceRatio,
  board.createMeeting,
  board.listMeetings,
  board.getMeeting,
  board.addMeetingItem,
  board.declareConflict,
  board.castVote,
  board.recordDecision,
  boardPack.reorderItems,
  boardPack.getItemPack,
  boardPack.getMeetingPackPdf,
  register.listRegister,
  register.getRegisterEntry,
  register.verifyRegister,
  register.registerCsv,
  register.registerGeoJson,
  register.correctRegisterEntry,
  boardPack.registerNoticePdf,
  register.registerTile,
  dashboard.getDashboard,
  followUps.listFollowUps,
  followUps.getFollowUp,
  followUps.recordFollowUpOutcome,
  followUps.addFollowUpEvidence,
  followUps.getFollowUpEvidence,
  jobs.runJobNow,
  jobs.getJobRun,
];
