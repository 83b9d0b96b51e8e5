import type { Sequelize } from 'sequelize';
import { initMembershipModel } from '../accounts/membership.model';
import { initUserModel } from '../accounts/user.model';
import { initOrganizationModel } from '../sites/organization.model';
import { initSiteModel } from '../sites/site.model';

/** Binds every model to this database, once at start-up. Add a line when a component adds a model. */
export function initModels(sequelize: Sequelize): void {
  initOrganizationModel(sequelize);
  initSiteModel(sequelize);
  initUserModel(sequelize);
  initMembershipModel(sequelize);
}
