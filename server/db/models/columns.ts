import { DataTypes } from 'sequelize'

// The columns most tables share, defined once: an auto-increment id and the timestamps.
// Functions, not constants: Model.init() writes into each attribute object (its model, its
// field name), so every model needs objects of its own.
export const idColumn = () => ({ id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true } })
export const createdAtColumn = () => ({ createdAt: { type: DataTypes.DATE, field: 'created_at' } })
export const updatedAtColumn = () => ({ updatedAt: { type: DataTypes.DATE, field: 'updated_at' } })
