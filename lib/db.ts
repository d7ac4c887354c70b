import { Sequelize } from "sequelize";
import { ApiToken } from "@/models/api-token";
import { BenchReading } from "@/models/bench-reading";
import { Comment } from "@/models/comment";
import { Invitation } from "@/models/invitation";
import { Measurement } from "@/models/measurement";
import { Membership } from "@/models/membership";
import { OutboxEmail } from "@/models/outbox-email";
import { Project } from "@/models/project";
import { ReviewEvent } from "@/models/review-event";
import { RUN_HEAVY_COLUMNS, Run } from "@/models/run";
import { RunJob } from "@/models/run-job";
import { Team } from "@/models/team";
import { User } from "@/models/user";
import { env } from "./env";

/** Build a Sequelize instance for a connection URL (small pool, quiet, short connect timeout). */
export function createSequelize(url: string): Sequelize {
  return new Sequelize(url, {
    dialect: "postgres",
    logging: false,
    // Pooled connections that fail are evicted, so the app recovers when the database comes back.
    pool: { max: 5, min: 0, idle: 10_000, acquire: 10_000, evict: 5_000 },
    dialectOptions: { connectionTimeoutMillis: 3_000 },
  });
}

// One instance per process, kept across Next dev hot reloads.
const globalDb = globalThis as unknown as { __phasewrightSequelize?: Sequelize };
export const sequelize: Sequelize = globalDb.__phasewrightSequelize ?? createSequelize(env.DATABASE_URL);
globalDb.__phasewrightSequelize = sequelize;

/** Initialise every model and association on `sequelize` (idempotent; re-run after a hot reload). */
function initModels(db: Sequelize): void {
  for (const model of [
    User,
    Team,
    Membership,
    Invitation,
    ApiToken,
    Project,
    Run,
    RunJob,
    Comment,
    ReviewEvent,
    Measurement,
    BenchReading,
    OutboxEmail,
  ]) {
    model.initModel(db);
  }

  Team.hasMany(Membership, { foreignKey: "teamId", as: "memberships" });
  Membership.belongsTo(Team, { foreignKey: "teamId", as: "team" });
  User.hasMany(Membership, { foreignKey: "userId", as: "memberships" });
  Membership.belongsTo(User, { foreignKey: "userId", as: "user" });

  Invitation.belongsTo(Team, { foreignKey: "teamId", as: "team" });
  Invitation.belongsTo(User, { foreignKey: "invitedById", as: "invitedBy" });
  ApiToken.belongsTo(User, { foreignKey: "userId", as: "user" });

  Team.hasMany(Project, { foreignKey: "teamId", as: "projects" });
  Project.belongsTo(Team, { foreignKey: "teamId", as: "team" });
  Project.belongsTo(User, { foreignKey: "createdById", as: "createdBy" });

  Project.hasMany(Run, { foreignKey: "projectId", as: "runs" });
  Run.belongsTo(Project, { foreignKey: "projectId", as: "project" });
  Run.belongsTo(User, { foreignKey: "authorId", as: "author" });
  Run.belongsTo(Run, { foreignKey: "supersedesId", as: "supersedes" });

  Run.hasOne(RunJob, { foreignKey: "runId", as: "job" });
  RunJob.belongsTo(Run, { foreignKey: "runId", as: "run" });

  Run.hasMany(Comment, { foreignKey: "runId", as: "comments" });
  Comment.belongsTo(Run, { foreignKey: "runId", as: "run" });
  Comment.belongsTo(User, { foreignKey: "authorId", as: "author" });
  Comment.belongsTo(User, { foreignKey: "settledById", as: "settledBy" });
  Comment.belongsTo(Comment, { foreignKey: "parentId", as: "parent" });
  Comment.hasMany(Comment, { foreignKey: "parentId", as: "replies" });

  Run.hasMany(ReviewEvent, { foreignKey: "runId", as: "reviewEvents" });
  ReviewEvent.belongsTo(Run, { foreignKey: "runId", as: "run" });
  ReviewEvent.belongsTo(User, { foreignKey: "actorId", as: "actor" });

  Project.hasMany(Measurement, { foreignKey: "projectId", as: "measurements" });
  Measurement.belongsTo(Project, { foreignKey: "projectId", as: "project" });
  Measurement.belongsTo(User, { foreignKey: "uploadedById", as: "uploadedBy" });

  Run.hasMany(BenchReading, { foreignKey: "runId", as: "readings" });
  BenchReading.belongsTo(Run, { foreignKey: "runId", as: "run" });
  BenchReading.belongsTo(User, { foreignKey: "authorId", as: "author" });
}

initModels(sequelize);

/** Is the database reachable within `timeoutMs`? Never throws. */
export async function pingDatabase(timeoutMs = 2_000): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<false>((resolve) => {
    timer = setTimeout(() => resolve(false), timeoutMs);
  });
  try {
    return await Promise.race([sequelize.authenticate().then(() => true as const), timeout]);
  } catch {
    return false;
  } finally {
    clearTimeout(timer);
  }
}

export type { MeasurementData } from "@/models/measurement";
export type { OutboxStatus } from "@/models/outbox-email";
export type { ReviewAction } from "@/models/review-event";
export type { ReviewState, RunStatus } from "@/models/run";
export {
  ApiToken,
  BenchReading,
  Comment,
  Invitation,
  Measurement,
  Membership,
  OutboxEmail,
  Project,
  ReviewEvent,
  RUN_HEAVY_COLUMNS,
  Run,
  RunJob,
  Team,
  User,
};
