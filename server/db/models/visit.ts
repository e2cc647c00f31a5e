import { DataTypes } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { RightNowItem } from '#shared/triage/rules'
import type { KitStatus, NotGivenReason, VisitStatus, WasteReason, WindowCheck } from '#shared/visit/rules'
import type { Appointment } from './appointment'
import type { Injection } from './injection'
import type { Patient } from './patient'
import type { Regimen } from './regimen'
import type { TriageItem } from './triage-item'
import type { User } from './user'
import { RecordModel, statusColumn } from './columns'

/**
 * One injection visit on a clinic day: for an appointment or a walk-in. It holds the checks
 * before the kit (identity, hypersensitivity, the right-now signs asked in person, the
 * window), then how it ended: given (its injection), not given (a reason) or stopped.
 */
export class Visit extends RecordModel<InferAttributes<Visit>, InferCreationAttributes<Visit>> {
  declare patientId: ForeignKey<Patient['id']>
  declare appointmentId: ForeignKey<Appointment['id']> | null
  declare visitDate: string
  declare status: CreationOptional<VisitStatus>
  declare openedByUserId: ForeignKey<User['id']>
  declare checkedAt: CreationOptional<Date | null>
  declare checkedByUserId: CreationOptional<ForeignKey<User['id']> | null>
  declare hypersensitivity: CreationOptional<boolean | null>
  declare rightNow: CreationOptional<RightNowItem[] | null>
  /** How the day fell against his window when the checks were recorded. */
  declare windowCheck: CreationOptional<WindowCheck | null>
  declare windowReason: CreationOptional<string | null>
  declare notGivenReason: CreationOptional<NotGivenReason | null>
  declare notGivenNote: CreationOptional<string | null>
  declare injectionId: CreationOptional<ForeignKey<Injection['id']> | null>
  declare mixGapMinutes: CreationOptional<number | null>
  declare lateMixAcknowledged: CreationOptional<boolean | null>
  declare observationNote: CreationOptional<string | null>
  declare nextAppointmentId: CreationOptional<ForeignKey<Appointment['id']> | null>
  declare triageItemId: CreationOptional<ForeignKey<TriageItem['id']> | null>
  declare closedAt: CreationOptional<Date | null>
  declare closedByUserId: CreationOptional<ForeignKey<User['id']> | null>
  declare kits?: NonAttribute<VisitKit[]>
  declare patient?: NonAttribute<Patient>
  declare injection?: NonAttribute<Injection | null>

  static initModel(sequelize: Sequelize) {
    Visit.initRecord(sequelize, 'visits', {
      visitDate: { type: DataTypes.DATEONLY, allowNull: false, field: 'visit_date' },
      ...statusColumn('here'),
      checkedAt: { type: DataTypes.DATE, allowNull: true, field: 'checked_at' },
      hypersensitivity: { type: DataTypes.BOOLEAN, allowNull: true },
      rightNow: { type: DataTypes.JSON, allowNull: true, field: 'right_now' },
      windowCheck: { type: DataTypes.JSON, allowNull: true, field: 'window_check' },
      windowReason: { type: DataTypes.TEXT, allowNull: true, field: 'window_reason' },
      notGivenReason: { type: DataTypes.STRING, allowNull: true, field: 'not_given_reason' },
      notGivenNote: { type: DataTypes.TEXT, allowNull: true, field: 'not_given_note' },
      mixGapMinutes: { type: DataTypes.INTEGER, allowNull: true, field: 'mix_gap_minutes' },
      lateMixAcknowledged: { type: DataTypes.BOOLEAN, allowNull: true, field: 'late_mix_acknowledged' },
      observationNote: { type: DataTypes.TEXT, allowNull: true, field: 'observation_note' },
      closedAt: { type: DataTypes.DATE, allowNull: true, field: 'closed_at' },
    })
  }
}

/** A kit prepared for a visit: its label, its inspection, when it was mixed, how it ended. */
export class VisitKit extends RecordModel<InferAttributes<VisitKit>, InferCreationAttributes<VisitKit>> {
  declare visitId: ForeignKey<Visit['id']>
  declare patientId: ForeignKey<Patient['id']>
  declare regimenId: ForeignKey<Regimen['id']>
  declare gtin: string | null
  declare lotNumber: string
  declare lotExpiresOn: string
  declare powderOk: boolean
  declare diluentOk: boolean
  declare inspectedByUserId: ForeignKey<User['id']>
  declare mixedAt: CreationOptional<Date | null>
  declare status: CreationOptional<KitStatus>
  declare wasteReason: CreationOptional<WasteReason | null>
  declare wasteNote: CreationOptional<string | null>
  declare wastedAt: CreationOptional<Date | null>
  declare regimen?: NonAttribute<Regimen>

  static initModel(sequelize: Sequelize) {
    VisitKit.initRecord(sequelize, 'visit_kits', {
      gtin: { type: DataTypes.STRING, allowNull: true },
      lotNumber: { type: DataTypes.STRING, allowNull: false, field: 'lot_number' },
      lotExpiresOn: { type: DataTypes.DATEONLY, allowNull: false, field: 'lot_expires_on' },
      powderOk: { type: DataTypes.BOOLEAN, allowNull: false, field: 'powder_ok' },
      diluentOk: { type: DataTypes.BOOLEAN, allowNull: false, field: 'diluent_ok' },
      mixedAt: { type: DataTypes.DATE, allowNull: true, field: 'mixed_at' },
      ...statusColumn('prepared'),
      wasteReason: { type: DataTypes.STRING, allowNull: true, field: 'waste_reason' },
      wasteNote: { type: DataTypes.TEXT, allowNull: true, field: 'waste_note' },
      wastedAt: { type: DataTypes.DATE, allowNull: true, field: 'wasted_at' },
    })
  }
}
