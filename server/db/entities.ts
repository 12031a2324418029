import { UserEntity } from '../modules/auth/user.entity';
import { UserTokenEntity } from '../modules/auth/user-token.entity';
import { OutboxMessageEntity } from '../modules/mail/outbox-message.entity';
import { CapturedMailEntity } from '../modules/dev-mail/captured-mail.entity';
import { AuditLogEntity } from '../modules/audit/audit-log.entity';
import { DocumentEntity } from '../modules/revisions/document.entity';
import { RevisionEntity } from '../modules/revisions/revision.entity';
import { SetupEntity } from '../modules/setups/setup.entity';
import { ReviewApprovalEntity } from '../modules/revisions/review-approval.entity';

import { MotorEntity } from '../modules/motors/motor.entity';
import { BenchCheckEntity } from '../modules/motors/bench-check.entity';
import { RunEntity } from '../modules/runs/run.entity';
import { ImageEntity } from '../modules/images/image.entity';
import { WatchDigestItemEntity, WatchEntity, WatchPreferenceEntity } from '../modules/watches/watch.entity';

/** Every entity the data source knows; modules add theirs here. */
export const entities = [
  UserEntity,
  UserTokenEntity,
  OutboxMessageEntity,
  CapturedMailEntity,
  AuditLogEntity,
  DocumentEntity,
  RevisionEntity,
  SetupEntity,
  ReviewApprovalEntity,
  MotorEntity,
  BenchCheckEntity,
  RunEntity,
  ImageEntity,
  WatchEntity,
  WatchPreferenceEntity,
  WatchDigestItemEntity,
];
