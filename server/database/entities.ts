import { ActivityEvent } from '../activity/activity-event.entity';
import { ImageAlignment } from '../alignments/image-alignment.entity';
import { AnnotationClass } from '../annotations/annotation-class.entity';
import { Annotation } from '../annotations/annotation.entity';
import { Material } from '../archive/material.entity';
import { RouteStep } from '../archive/route-step.entity';
import { SampleLayer } from '../archive/sample-layer.entity';
import { Sample } from '../archive/sample.entity';
import { SpecimenLocation } from '../archive/specimen-location.entity';
import { Specimen } from '../archive/specimen.entity';
import { CalibrationChange } from '../calibration/calibration-change.entity';
import { CalibrationPreset } from '../calibration/calibration-preset.entity';
import { PasswordToken } from '../auth/password-token.entity';
import { User } from '../auth/user.entity';
import { FigureExport } from '../figures/figure-export.entity';
import { Figure } from '../figures/figure.entity';
import { Image } from '../images/image.entity';
import { MeasurementHistory } from '../measurements/measurement-history.entity';
import { Measurement } from '../measurements/measurement.entity';
import { NotificationSetting } from '../notifications/notification-setting.entity';
import { Notification } from '../notifications/notification.entity';
import { ProjectMembership } from '../projects/project-membership.entity';
import { Project } from '../projects/project.entity';
import { CommentThread } from '../reviews/comment-thread.entity';
import { Comment } from '../reviews/comment.entity';
import { FigureClearance } from '../reviews/figure-clearance.entity';
import { ReviewEvent } from '../reviews/review-event.entity';
import { ReviewSnapshot } from '../reviews/review-snapshot.entity';
import { Review } from '../reviews/review.entity';

/**
 * Every entity, imported as classes: a path glob would make TypeORM load second copies
 * of the modules under tsx, whose classes it then fails to recognise.
 */
export const ENTITIES = [
  User,
  PasswordToken,
  Project,
  ProjectMembership,
  Material,
  Sample,
  SampleLayer,
  RouteStep,
  Specimen,
  SpecimenLocation,
  Image,
  ImageAlignment,
  AnnotationClass,
  Annotation,
  CalibrationPreset,
  CalibrationChange,
  Measurement,
  MeasurementHistory,
  ActivityEvent,
  Figure,
  FigureExport,
  Review, ReviewEvent, ReviewSnapshot, CommentThread, Comment, Notification, NotificationSetting,
  FigureClearance,
];
