import type { Sequelize } from "sequelize";
import { getSequelize } from "@/lib/db/sequelize";
import { trackChanges } from "@/lib/db/change-tracker";
import { initOrganisation, Organisation } from "./Organisation";
import { initUser, User } from "./User";
import { initAuthToken, AuthToken } from "./AuthToken";
import { initRateLimitHit, RateLimitHit } from "./RateLimitHit";
import { initChainSpec, ChainSpec } from "./ChainSpec";
import { initLift, Lift } from "./Lift";
import { initLiftRevision, LiftRevision } from "./LiftRevision";
import { initTrain, Train } from "./Train";
import { initScenario, Scenario } from "./Scenario";
import { initAuditEntry, AuditEntry } from "./AuditEntry";
import { initComment, Comment } from "./Comment";
import { initRun, Run } from "./Run";
import { initStudy, Study } from "./Study";
import { initStudyCase, StudyCase } from "./StudyCase";
import { initReport, Report } from "./Report";
import { initReportReview, ReportReview } from "./ReportReview";
// Operations: logbook, uploads, alerts, recordings, training sessions.
import { initLogbookEntry, LogbookEntry } from "./LogbookEntry";
import { initLogbookSetting, LogbookSetting } from "./LogbookSetting";
import { initUpload, Upload } from "./Upload";
import { initAlert, Alert } from "./Alert";
import { initRecording, Recording } from "./Recording";
import { initRecordingSample, RecordingSample } from "./RecordingSample";
import { initCalibration, Calibration } from "./Calibration";
import { initTrainingSession, TrainingSession } from "./TrainingSession";
import { initTrainingItem, TrainingItem } from "./TrainingItem";
import { initTrainingCaption, TrainingCaption } from "./TrainingCaption";
import { initTrainingView, TrainingView } from "./TrainingView";

export { Organisation, User, AuthToken, RateLimitHit };
export { ChainSpec, Lift, LiftRevision, Train, Scenario, AuditEntry, Comment };
export { Run };
export { Study, StudyCase, Report, ReportReview };
export { LogbookEntry, LogbookSetting, Upload, Alert, Recording, RecordingSample, Calibration };
export { TrainingSession, TrainingItem, TrainingCaption, TrainingView };

/**
 * Every model, bound to one Sequelize instance. To add a model: import its class and init function,
 * add it to this object type, init it in `initModels`, and set its associations in `associate`.
 */
export interface Models {
  Organisation: typeof Organisation;
  User: typeof User;
  AuthToken: typeof AuthToken;
  RateLimitHit: typeof RateLimitHit;
  ChainSpec: typeof ChainSpec;
  Lift: typeof Lift;
  LiftRevision: typeof LiftRevision;
  Train: typeof Train;
  Scenario: typeof Scenario;
  AuditEntry: typeof AuditEntry;
  Comment: typeof Comment;
  Run: typeof Run;
  Study: typeof Study;
  StudyCase: typeof StudyCase;
  Report: typeof Report;
  ReportReview: typeof ReportReview;
  LogbookEntry: typeof LogbookEntry;
  LogbookSetting: typeof LogbookSetting;
  Upload: typeof Upload;
  Alert: typeof Alert;
  Recording: typeof Recording;
  RecordingSample: typeof RecordingSample;
  Calibration: typeof Calibration;
  TrainingSession: typeof TrainingSession;
  TrainingItem: typeof TrainingItem;
  TrainingCaption: typeof TrainingCaption;
  TrainingView: typeof TrainingView;
}

const boundTo = new WeakMap<Sequelize, Models>();

function associate(m: Models): void {
  m.Organisation.hasMany(m.User, { foreignKey: "organisationId", as: "users" });
  m.User.belongsTo(m.Organisation, { foreignKey: "organisationId", as: "organisation" });
  m.User.hasMany(m.AuthToken, { foreignKey: "userId", as: "tokens" });
  m.AuthToken.belongsTo(m.User, { foreignKey: "userId", as: "user" });
  // Design data. lifts.current_revision_id and lift_revisions.lift_id point at each other: no sync constraints.
  m.Lift.hasMany(m.LiftRevision, { foreignKey: "liftId", as: "revisions", constraints: false });
  m.LiftRevision.belongsTo(m.Lift, { foreignKey: "liftId", as: "lift", constraints: false });
  m.Lift.belongsTo(m.LiftRevision, { foreignKey: "currentRevisionId", as: "currentRevision", constraints: false });
  m.LiftRevision.belongsTo(m.ChainSpec, { foreignKey: "chainSpecId", as: "chainSpec" });
  m.Scenario.belongsTo(m.Lift, { foreignKey: "liftId", as: "lift" });
  m.Scenario.belongsTo(m.LiftRevision, { foreignKey: "liftRevisionId", as: "liftRevision" });
  m.Scenario.belongsTo(m.Train, { foreignKey: "trainId", as: "train" });
  m.Comment.belongsTo(m.Scenario, { foreignKey: "scenarioId", as: "scenario" });
  m.Comment.belongsTo(m.User, { foreignKey: "userId", as: "author" });
  m.AuditEntry.belongsTo(m.User, { foreignKey: "userId", as: "user" });
  // Runs.
  m.Scenario.hasMany(m.Run, { foreignKey: "scenarioId", as: "runs" });
  m.Run.belongsTo(m.Scenario, { foreignKey: "scenarioId", as: "scenario" });
  m.Run.belongsTo(m.LiftRevision, { foreignKey: "liftRevisionId", as: "liftRevision" });
  m.Run.belongsTo(m.User, { foreignKey: "startedBy", as: "starter" });
  // Studies and reports.
  m.Study.belongsTo(m.Scenario, { foreignKey: "scenarioId", as: "scenario" });
  m.Study.hasMany(m.StudyCase, { foreignKey: "studyId", as: "cases" });
  m.StudyCase.belongsTo(m.Study, { foreignKey: "studyId", as: "study" });
  m.Report.belongsTo(m.Scenario, { foreignKey: "scenarioId", as: "scenario" });
  m.Report.hasMany(m.ReportReview, { foreignKey: "reportId", as: "reviews" });
  m.ReportReview.belongsTo(m.Report, { foreignKey: "reportId", as: "report" });
  m.ReportReview.belongsTo(m.User, { foreignKey: "userId", as: "user" });
  // Operations.
  m.LogbookEntry.belongsTo(m.User, { foreignKey: "userId", as: "author" });
  m.Recording.hasMany(m.RecordingSample, { foreignKey: "recordingId", as: "samples" });
  m.Recording.hasMany(m.Calibration, { foreignKey: "recordingId", as: "calibrations" });
  m.TrainingSession.hasMany(m.TrainingItem, { foreignKey: "sessionId", as: "items" });
  m.TrainingItem.hasMany(m.TrainingCaption, { foreignKey: "itemId", as: "captions" });
  m.TrainingItem.belongsTo(m.Run, { foreignKey: "runId", as: "run" });
  m.TrainingView.belongsTo(m.User, { foreignKey: "userId", as: "viewer" });
}

/** Inits all models on `sequelize` and sets their associations. Calling it again is a no-op. */
export function initModels(sequelize: Sequelize): Models {
  const existing = boundTo.get(sequelize);
  if (existing) return existing;
  // Counts writes per table so cached answers (lib/http/read-cache.ts, the session's user row) go stale.
  trackChanges(sequelize);
  const m: Models = {
    Organisation: initOrganisation(sequelize),
    User: initUser(sequelize),
    AuthToken: initAuthToken(sequelize),
    RateLimitHit: initRateLimitHit(sequelize),
    ChainSpec: initChainSpec(sequelize),
    Lift: initLift(sequelize),
    LiftRevision: initLiftRevision(sequelize),
    Train: initTrain(sequelize),
    Scenario: initScenario(sequelize),
    AuditEntry: initAuditEntry(sequelize),
    Comment: initComment(sequelize),
    Run: initRun(sequelize),
    Study: initStudy(sequelize),
    StudyCase: initStudyCase(sequelize),
    Report: initReport(sequelize),
    ReportReview: initReportReview(sequelize),
    LogbookEntry: initLogbookEntry(sequelize),
    LogbookSetting: initLogbookSetting(sequelize),
    Upload: initUpload(sequelize),
    Alert: initAlert(sequelize),
    Recording: initRecording(sequelize),
    RecordingSample: initRecordingSample(sequelize),
    Calibration: initCalibration(sequelize),
    TrainingSession: initTrainingSession(sequelize),
    TrainingItem: initTrainingItem(sequelize),
    TrainingCaption: initTrainingCaption(sequelize),
    TrainingView: initTrainingView(sequelize),
  };
  associate(m);
  boundTo.set(sequelize, m);
  return m;
}

/** The models bound to the process-wide connection from lib/db/sequelize.ts. */
export function getModels(): Models {
  return initModels(getSequelize());
}

/** Short alias: `db().User.findOne(...)`. */
export const db = getModels;
