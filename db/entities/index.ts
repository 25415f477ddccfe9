// The entity list handed to the DataSource (not a barrel for app code).
import { Attachment } from './attachment.entity';
import { AuditEvent } from './audit-event.entity';
import { Invitation } from './invitation.entity';
import { Membership } from './membership.entity';
import { Network } from './network.entity';
import { Observation } from './observation.entity';
import { PasswordResetToken } from './password-reset-token.entity';
import { PendingSignUp } from './pending-sign-up.entity';
import { RateLevelRow } from './rate-level.entity';
import { RateLimitHit } from './rate-limit-hit.entity';
import { ReportSnapshot } from './report-snapshot.entity';
import { Site } from './site.entity';
import { Strip } from './strip.entity';
import { Trial } from './trial.entity';
import { TrialSeries } from './trial-series.entity';
import { User } from './user.entity';
import { SignInFailure } from './sign-in-failure.entity';
import { Job } from './job.entity';
import { IdempotencyKey } from './idempotency-key.entity';
import { ReportPdf } from './report-pdf.entity';
import { UserSession } from './user-session.entity';

export const ENTITIES = [
  User,
  Network,
  Membership,
  Trial,
  TrialSeries,
  RateLevelRow,
  Site,
  Strip,
  Observation,
  Attachment,
  Invitation,
  PasswordResetToken,
  PendingSignUp,
  AuditEvent,
  ReportSnapshot,
  SignInFailure,
  Job,
  IdempotencyKey,
  ReportPdf,
  UserSession,
  RateLimitHit,
];
