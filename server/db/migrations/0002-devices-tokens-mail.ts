import { DataTypes } from 'sequelize';
import type { Migration } from '../migration';

/**
 * Sign-in state and outgoing mail: the devices people sign in on, refresh tokens (stored hashed,
 * grouped in families so a re-used token revokes its whole chain), single-use links for
 * invitations and password resets (hashed too), and a copy of every e-mail the system sends.
 */
export const devicesTokensMail: Migration = {
  name: '0002-devices-tokens-mail',
  async up(queryInterface) {
    const timestamps = {
      createdAt: { type: DataTypes.DATE, allowNull: false },
      updatedAt: { type: DataTypes.DATE, allowNull: false },
    };
    await queryInterface.createTable('devices', {
      id: { type: DataTypes.UUID, primaryKey: true },
      userId: { type: DataTypes.UUID, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
      name: { type: DataTypes.STRING(100), allowNull: false },
      lastSeenAt: { type: DataTypes.DATE, allowNull: true },
      lastSyncAt: { type: DataTypes.DATE, allowNull: true },
      ...timestamps,
    });
    await queryInterface.addIndex('devices', ['userId']);

    await queryInterface.createTable('refresh_tokens', {
      id: { type: DataTypes.UUID, primaryKey: true },
      familyId: { type: DataTypes.UUID, allowNull: false },
      userId: { type: DataTypes.UUID, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
      deviceId: { type: DataTypes.UUID, allowNull: true, references: { model: 'devices', key: 'id' }, onDelete: 'SET NULL' },
      /** SHA-256 of the token, hex; the token itself is never stored. */
      tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      /** When this token was exchanged for the next one; presenting it again is re-use. */
      rotatedAt: { type: DataTypes.DATE, allowNull: true },
      revokedAt: { type: DataTypes.DATE, allowNull: true },
      ...timestamps,
    });
    await queryInterface.addIndex('refresh_tokens', ['familyId']);
    await queryInterface.addIndex('refresh_tokens', ['userId']);

    await queryInterface.createTable('account_links', {
      id: { type: DataTypes.UUID, primaryKey: true },
      userId: { type: DataTypes.UUID, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
      /** `invitation` or `password-reset`. */
      purpose: { type: DataTypes.STRING(16), allowNull: false },
      tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      usedAt: { type: DataTypes.DATE, allowNull: true },
      ...timestamps,
    });
    await queryInterface.addIndex('account_links', ['userId']);

    await queryInterface.createTable('mail_messages', {
      id: { type: DataTypes.UUID, primaryKey: true },
      organizationId: { type: DataTypes.UUID, allowNull: true, references: { model: 'organizations', key: 'id' }, onDelete: 'SET NULL' },
      /** Recipients, comma-separated. */
      recipients: { type: DataTypes.TEXT, allowNull: false },
      subject: { type: DataTypes.STRING(300), allowNull: false },
      textBody: { type: DataTypes.TEXT, allowNull: false },
      htmlBody: { type: DataTypes.TEXT, allowNull: true },
      /** JSON list of `{filename, contentType, sizeBytes}`; the content itself is not kept. */
      attachments: { type: DataTypes.TEXT, allowNull: false },
      /** `sending`, `sent` or `failed`. */
      status: { type: DataTypes.STRING(16), allowNull: false },
      errorMessage: { type: DataTypes.STRING(500), allowNull: true },
      transportMessageId: { type: DataTypes.STRING(300), allowNull: true },
      ...timestamps,
    });
    await queryInterface.addIndex('mail_messages', ['organizationId', 'createdAt']);
  },
  async down(queryInterface) {
    await queryInterface.dropTable('mail_messages');
    await queryInterface.dropTable('account_links');
    await queryInterface.dropTable('refresh_tokens');
    await queryInterface.dropTable('devices');
  },
};
