import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ModelStatic, Sequelize } from 'sequelize'

// The columns many tables share, defined once: an auto-increment id, the timestamps, a form's
// request id and a status with its first value. Functions, not constants: Model.init() writes
// into each attribute object (its model, its field name), so every model needs objects of its own.
export const idColumn = () => ({ id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true } })
export const createdAtColumn = () => ({ createdAt: { type: DataTypes.DATE, field: 'created_at' } })
export const timestampColumns = () => ({ ...createdAtColumn(), updatedAt: { type: DataTypes.DATE, field: 'updated_at' } })
export const requestIdColumn = () => ({ requestId: { type: DataTypes.STRING, allowNull: true, field: 'request_id' } })
export const statusColumn = (initial: string) => ({ status: { type: DataTypes.STRING, allowNull: false, defaultValue: initial } })

/** The columns Model.init() takes for model M, less the three a RecordModel brings. */
type OwnColumns<M extends Model> = Omit<Parameters<typeof Model.init<ModelStatic<M>, M>>[0], 'id' | 'createdAt' | 'updatedAt'>

/** A model of a table with an auto-increment id and both timestamps, declared and defined once. */
export abstract class RecordModel<Attributes extends object, CreationAttributes extends object = Attributes> extends Model<Attributes, CreationAttributes> {
  declare id: CreationOptional<number>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  /** Model.init() with the id first, the table's own columns, then the timestamps. */
  static initRecord<M extends Model>(this: ModelStatic<M>, sequelize: Sequelize, tableName: string, columns: OwnColumns<M>) {
    this.init({ ...idColumn(), ...columns, ...timestampColumns() } as Parameters<typeof Model.init<ModelStatic<M>, M>>[0], { sequelize, tableName })
  }
}

/** A record a form creates (`requestIdColumn()`), found again by the id the form made. */
export abstract class FormRecordModel<Attributes extends object, CreationAttributes extends object = Attributes> extends RecordModel<Attributes, CreationAttributes> {
  /** The id the form made (uuid), so a retry finds this record; null from older clients. */
  declare requestId: CreationOptional<string | null>
}
