import { DataTypes } from 'sequelize'
import type { ForeignKey, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { AcceptedMime, AttachmentKind } from '#shared/attachments/rules'
import type { LabResult } from './lab-result'
import type { Message } from './message'
import type { Patient } from './patient'
import type { User } from './user'
import { RecordModel } from './columns'

/**
 * A checked file on a patient's record, kept in the object store under objectKey. Pending
 * (messageId null) until its uploader sends it with a message; a PDF filed as a lab result
 * names that result.
 */
export class Attachment extends RecordModel<InferAttributes<Attachment>, InferCreationAttributes<Attachment>> {
  declare patientId: ForeignKey<Patient['id']>
  declare messageId: ForeignKey<Message['id']> | null
  declare objectKey: string
  declare kind: AttachmentKind
  declare mime: AcceptedMime
  declare byteSize: number
  declare fileName: string
  declare width: number | null
  declare height: number | null
  declare pages: number | null
  declare uploadedByUserId: ForeignKey<User['id']>
  declare labResultId: ForeignKey<LabResult['id']> | null
  declare uploadedBy?: NonAttribute<User>

  static initModel(sequelize: Sequelize) {
    Attachment.initRecord(sequelize, 'attachments', {
      objectKey: { type: DataTypes.STRING, allowNull: false, unique: true, field: 'object_key' },
      kind: { type: DataTypes.STRING, allowNull: false },
      mime: { type: DataTypes.STRING, allowNull: false },
      byteSize: { type: DataTypes.INTEGER, allowNull: false, field: 'byte_size' },
      fileName: { type: DataTypes.STRING, allowNull: false, field: 'file_name' },
      width: { type: DataTypes.INTEGER, allowNull: true },
      height: { type: DataTypes.INTEGER, allowNull: true },
      pages: { type: DataTypes.INTEGER, allowNull: true },
    })
  }
}
