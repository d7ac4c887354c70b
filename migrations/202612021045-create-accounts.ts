import { DataTypes, type QueryInterface } from "sequelize";
import type { MigrationFn } from "umzug";
import { fk, timestamps, uuidPk } from "./_columns";

const ROLES = ["owner", "designer", "reviewer", "viewer"];

/** Users, teams, memberships, invitations and API tokens. */
export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.createTable(
      "users",
      {
        id: uuidPk,
        email: { type: DataTypes.STRING(320), allowNull: false, unique: true },
        name: { type: DataTypes.STRING(120), allowNull: false },
        password_hash: { type: DataTypes.STRING(100), allowNull: false },
        ...timestamps,
      },
      { transaction },
    );
    await qi.sequelize.query(
      "ALTER TABLE users ADD CONSTRAINT users_email_lower_case CHECK (email = lower(email))",
      { transaction },
    );

    await qi.createTable(
      "teams",
      {
        id: uuidPk,
        name: { type: DataTypes.STRING(120), allowNull: false },
        slug: { type: DataTypes.STRING(64), allowNull: false, unique: true },
        ...timestamps,
      },
      { transaction },
    );

    await qi.createTable(
      "memberships",
      {
        id: uuidPk,
        team_id: fk("teams", "CASCADE"),
        user_id: fk("users", "CASCADE"),
        role: { type: DataTypes.ENUM(...ROLES), allowNull: false },
        ...timestamps,
      },
      { transaction },
    );
    await qi.addIndex("memberships", ["team_id", "user_id"], {
      unique: true,
      name: "memberships_team_id_user_id",
      transaction,
    });
    await qi.addIndex("memberships", ["user_id"], { name: "memberships_user_id", transaction });

    await qi.createTable(
      "invitations",
      {
        id: uuidPk,
        team_id: fk("teams", "CASCADE"),
        email: { type: DataTypes.STRING(320), allowNull: false },
        role: { type: DataTypes.ENUM(...ROLES), allowNull: false },
        token_hash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
        invited_by_id: fk("users", "CASCADE"),
        expires_at: { type: DataTypes.DATE, allowNull: false },
        accepted_at: { type: DataTypes.DATE, allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    await qi.addIndex("invitations", ["team_id"], { name: "invitations_team_id", transaction });

    await qi.createTable(
      "api_tokens",
      {
        id: uuidPk,
        user_id: fk("users", "CASCADE"),
        name: { type: DataTypes.STRING(120), allowNull: false },
        token_hash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
        prefix: { type: DataTypes.STRING(16), allowNull: false },
        last_used_at: { type: DataTypes.DATE, allowNull: true },
        revoked_at: { type: DataTypes.DATE, allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    await qi.addIndex("api_tokens", ["user_id"], { name: "api_tokens_user_id", transaction });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    for (const table of ["api_tokens", "invitations", "memberships", "teams", "users"]) {
      await qi.dropTable(table, { transaction });
    }
    await qi.sequelize.query('DROP TYPE IF EXISTS "enum_invitations_role", "enum_memberships_role"', {
      transaction,
    });
  });
};
