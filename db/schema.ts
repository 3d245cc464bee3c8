import type { ColumnType, Insertable, Selectable, Updateable } from 'kysely'
import type { Role } from '../shared/roles'
import type { InstrumentKind, InstrumentView } from '../shared/observing/instrument'
import type { SketchStatus } from '../shared/review/lifecycle'
import type { FormationKind } from '../shared/features/formations'
import type { CheckpointReason } from '../shared/sketch/api'

export type { SketchStatus }

// Instants are ISO 8601 UTC strings in every dialect, so the same queries run on
// SQLite and PostgreSQL and sort correctly as text.
type Instant = string
type CreatedAt = ColumnType<Instant, Instant | undefined, never>

export interface UsersTable {
  id: string
  email: string
  name: string
  password_hash: string
  role: Role
  email_verified_at: Instant | null
  disabled_at: Instant | null
  created_at: CreatedAt
  updated_at: Instant
}

export interface SitesTable {
  id: string
  user_id: string
  name: string
  latitude: number
  longitude: number
  elevation_m: number
  time_zone: string
  /** Set when this is the member's copy of a group site (2026-12-02-20). */
  group_site_id: ColumnType<string | null, string | null | undefined, string | null>
  created_at: CreatedAt
  updated_at: Instant
}

export type TokenPurpose = 'verify-email' | 'reset-password'

export interface AuthTokensTable {
  id: string
  user_id: string
  purpose: TokenPurpose
  token_hash: string
  expires_at: Instant
  used_at: Instant | null
  created_at: CreatedAt
}

export interface UserSessionsTable {
  id: string
  user_id: string
  created_at: CreatedAt
  expires_at: Instant
}

export interface SigninFailuresTable {
  id: string
  scope: 'account' | 'address' | 'pair'
  key: string
  at: Instant
}

export interface MailOutboxTable {
  id: string
  to_address: string
  subject: string
  text_body: string
  attempts: ColumnType<number, number | undefined, number>
  next_attempt_at: Instant
  lease_until: Instant | null
  sent_at: Instant | null
  failed_at: Instant | null
  last_error: string | null
  created_at: CreatedAt
  /** Past this instant the message is no longer worth sending (a link that has expired); null: always. */
  useful_until: Instant | null
}

export interface ObjectRemovalsTable {
  object_key: string
  queued_at: Instant
  attempts: ColumnType<number, number | undefined, number>
}

export interface AuditLogTable {
  id: string
  at: Instant
  actor_id: string | null
  action: string
  subject_type: string
  subject_id: string | null
  detail: string | null
}

export interface ObservationsTable {
  id: string
  user_id: string
  site_id: string
  observed_at: Instant
  /** The calendar date at the site, YYYY-MM-DD: the night's rise/set times are for it. */
  local_date: string
  time_zone: string
  instrument_kind: InstrumentKind
  magnification: number | null
  aperture_mm: number | null
  focal_length_mm: number | null
  eyepiece_mm: number | null
  view: InstrumentView
  /** Antoniadi scale, 1 (perfect) to 5 (very bad). */
  seeing: number | null
  /** 1 (very poor) to 5 (excellent). */
  transparency: number | null
  notes: string
  /** JSON: the lunar circumstances and that day's rise/set/transit, see shared/types/observation.ts. */
  circumstances: string
  computed_with: string
  illuminated_fraction: number
  age_days: number
  phase_name: string
  colongitude_deg: number
  created_at: CreatedAt
  updated_at: Instant
}

export type MeasurementKind = 'altitude' | 'azimuth'

export interface MeasurementsTable {
  id: string
  observation_id: string
  kind: MeasurementKind
  /** Clinometer reading or magnetic compass bearing, as read. */
  raw_deg: number
  /** Altitude, or true azimuth. */
  derived_deg: number
  predicted_deg: number
  residual_deg: number
  /** Magnetic declination applied to a compass bearing. */
  declination_deg: number | null
  created_at: CreatedAt
}

export interface PhotosTable {
  id: string
  user_id: string
  observation_id: string
  taken_at: Instant
  taken_at_source: 'exif' | 'observer' | 'upload'
  width: number
  height: number
  image_key: string
  thumb_key: string
  created_at: CreatedAt
}

export interface SketchesTable {
  id: string
  observation_id: string
  user_id: string
  status: ColumnType<SketchStatus, SketchStatus | undefined, SketchStatus>
  /** Optimistic concurrency: a save names the version it started from. */
  version: ColumnType<number, number | undefined, number>
  schema_version: number
  /** JSON, validated by the shapes schema on the way in. */
  shapes: string
  view_orientation: 'north-up' | 'zenith-up'
  view_flip: 'none' | 'inverted' | 'mirrored'
  raster_key: string | null
  thumb_small_key: string | null
  thumb_large_key: string | null
  /** The version the stored image was drawn from (2026-12-02-30); an older one is redrawn when next read. */
  raster_version: ColumnType<number | null, number | null | undefined, number | null>
  submitted_at: Instant | null
  created_at: CreatedAt
  updated_at: Instant
}

export interface SketchRevisionsTable {
  id: string
  sketch_id: string
  version: number
  schema_version: number
  shapes: string
  view_orientation: 'north-up' | 'zenith-up'
  view_flip: 'none' | 'inverted' | 'mirrored'
  raster_key: string | null
  created_by: string
  created_at: CreatedAt
  /** The editor's id for the save that made this revision (2026-12-02-05); null for the first, empty one. */
  save_id: ColumnType<string | null, string | null | undefined, never>
  /** JSON list of the steps that made this version from the one before (2026-12-02-30); null for none. */
  operations: ColumnType<string | null, string | null | undefined, string | null>
  /** Why `shapes` holds the whole drawing at this version; null when it is empty and only `operations` count. */
  checkpoint: ColumnType<CheckpointReason | null, CheckpointReason | null | undefined, CheckpointReason | null>
}

export interface SketchReviewsTable {
  id: string
  sketch_id: string
  actor_id: string
  from_status: SketchStatus
  to_status: SketchStatus
  comment: string
  created_at: CreatedAt
}

/** A published entry that pins a feature, with the entry's sort keys: a feature's listing in index order. */
export interface AtlasFeatureEntriesTable {
  feature_id: string
  entry_id: string
  entry_observed_at: Instant
  entry_colongitude_deg: number
}

export interface AtlasEntriesTable {
  sketch_id: string
  observer_id: string
  observer_name: string
  observed_at: Instant
  age_days: number
  phase_name: string
  colongitude_deg: number
  illuminated_fraction: number
  instrument_kind: InstrumentKind
  instrument_label: string
  /** Rounded to 0.1°: the public never sees an observer's precise place. */
  site_latitude: number
  site_longitude: number
  published_at: Instant
  /** The listed group the entry was observed for (2026-12-02-20); the name is null while the group is private. */
  group_id: ColumnType<string | null, string | null | undefined, string | null>
  group_name: ColumnType<string | null, string | null | undefined, string | null>
}

export interface FeaturesTable {
  id: string
  name: string
  description: ColumnType<string, string | undefined, string>
  status: ColumnType<'proposed' | 'confirmed', 'proposed' | 'confirmed' | undefined, 'proposed' | 'confirmed'>
  proposed_by: string | null
  merged_into: string | null
  /** Mean selenographic position of the pins, east-positive longitude; null until pinned. */
  latitude: number | null
  longitude: number | null
  /** RMS angular distance of the pins from that mean. */
  spread_deg: number | null
  pin_count: ColumnType<number, number | undefined, number>
  /** The reference formation this user name stands for, if linked. */
  formation_id: ColumnType<string | null, string | null | undefined, string | null>
  created_at: CreatedAt
  updated_at: Instant
}

/** An IAU-named formation of the reference layer (db/data/formations.ts). */
export interface FormationsTable {
  id: string
  name: string
  name_key: string
  kind: FormationKind
  latitude: number
  longitude: number
  diameter_km: number
}

/** A pin inside a formation's outline. */
export interface FormationPinsTable {
  formation_id: string
  sketch_id: string
  tag_id: string
}

export interface FeatureNamesTable {
  id: string
  feature_id: string
  name: string
  /** Lower case, accents removed, punctuation folded to spaces: what searches match. */
  name_key: string
  kind: 'name' | 'alias'
  created_at: CreatedAt
}

export interface FeatureNameWordsTable {
  word: string
  name_id: string
  /** The name's folded key, copied so that search reads candidates from this index alone. */
  name_key: ColumnType<string, string | undefined, string>
}

export interface FeatureNameTrigramsTable {
  trigram: string
  name_id: string
  name_key: ColumnType<string, string | undefined, string>
}

export interface FeatureTrigramCountsTable {
  trigram: string
  names: number
}

export interface FeatureTagsTable {
  id: string
  sketch_id: string
  feature_id: string
  user_id: string
  /** Unit disk, x right and y up, in the sketch's view. */
  disk_x: number
  disk_y: number
  view_orientation: 'north-up' | 'zenith-up'
  view_flip: 'none' | 'inverted' | 'mirrored'
  latitude: number
  longitude: number
  created_at: CreatedAt
}

export type GroupVisibility = 'private' | 'listed'
export type GroupRole = 'leader' | 'co-leader' | 'member'
export type MembershipStatus = 'active' | 'pending'

export interface GroupsTable {
  id: string
  name: string
  description: string
  visibility: GroupVisibility
  join_code: string | null
  /** 1 when the leader approves each request made with the join code. */
  join_approval: number
  created_by: string
  created_at: CreatedAt
  updated_at: Instant
}

export interface GroupMembersTable {
  id: string
  group_id: string
  user_id: string
  role: GroupRole
  status: MembershipStatus
  /** 1 when the member asked for e-mail reminders on campaign evenings. */
  reminders: number
  created_at: CreatedAt
  updated_at: Instant
}

export interface GroupSitesTable {
  id: string
  group_id: string
  name: string
  latitude: number
  longitude: number
  elevation_m: number
  time_zone: string
  created_at: CreatedAt
  updated_at: Instant
}

export interface GroupInvitationsTable {
  id: string
  group_id: string
  email: string
  token_hash: string
  invited_by: string
  expires_at: Instant
  used_at: Instant | null
  used_by: string | null
  revoked_at: Instant | null
  created_at: CreatedAt
}

export type CampaignKind = 'evening' | 'morning'

export interface CampaignsTable {
  id: string
  group_id: string
  title: string
  brief: string
  kind: CampaignKind
  group_site_id: string
  /** HH:MM at the site. */
  clock_time: string
  /** JSON array of local dates. */
  nights: string
  asks_sketch: number
  asks_altitude: number
  asks_azimuth: number
  reminder_minutes: number
  created_by: string
  created_at: CreatedAt
  updated_at: Instant
}

export interface CampaignCommentsTable {
  id: string
  campaign_id: string
  member_id: string
  local_date: string
  author_id: string
  body: string
  digest_at: Instant | null
  created_at: CreatedAt
}

export interface CampaignMailLogTable {
  key: string
  sent_at: Instant
}

export interface Database {
  users: UsersTable
  sites: SitesTable
  auth_tokens: AuthTokensTable
  signin_failures: SigninFailuresTable
  user_sessions: UserSessionsTable
  object_removals: ObjectRemovalsTable
  mail_outbox: MailOutboxTable
  audit_log: AuditLogTable
  observations: ObservationsTable
  measurements: MeasurementsTable
  photos: PhotosTable
  sketches: SketchesTable
  sketch_revisions: SketchRevisionsTable
  sketch_reviews: SketchReviewsTable
  atlas_entries: AtlasEntriesTable
  atlas_feature_entries: AtlasFeatureEntriesTable
  features: FeaturesTable
  feature_names: FeatureNamesTable
  feature_name_words: FeatureNameWordsTable
  feature_name_trigrams: FeatureNameTrigramsTable
  feature_trigram_counts: FeatureTrigramCountsTable
  feature_tags: FeatureTagsTable
  formations: FormationsTable
  formation_pins: FormationPinsTable
  groups: GroupsTable
  group_members: GroupMembersTable
  group_sites: GroupSitesTable
  group_invitations: GroupInvitationsTable
  campaigns: CampaignsTable
  campaign_comments: CampaignCommentsTable
  campaign_mail_log: CampaignMailLogTable
}

export type User = Selectable<UsersTable>
export type NewUser = Insertable<UsersTable>
export type UserUpdate = Updateable<UsersTable>
export type Site = Selectable<SitesTable>
export type NewSite = Insertable<SitesTable>
export type SiteUpdate = Updateable<SitesTable>
export type OutboxMail = Selectable<MailOutboxTable>
export type AuditEntry = Selectable<AuditLogTable>
export type Observation = Selectable<ObservationsTable>
export type NewObservation = Insertable<ObservationsTable>
export type Measurement = Selectable<MeasurementsTable>
export type Photo = Selectable<PhotosTable>
export type Sketch = Selectable<SketchesTable>
export type NewSketch = Insertable<SketchesTable>
export type SketchRevision = Selectable<SketchRevisionsTable>
export type SketchReview = Selectable<SketchReviewsTable>
export type AtlasEntry = Selectable<AtlasEntriesTable>
export type Feature = Selectable<FeaturesTable>
export type FeatureTag = Selectable<FeatureTagsTable>
export type FormationRow = Selectable<FormationsTable>
export type Group = Selectable<GroupsTable>
export type GroupMember = Selectable<GroupMembersTable>
export type GroupSite = Selectable<GroupSitesTable>
export type Campaign = Selectable<CampaignsTable>
