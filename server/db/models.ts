import type { Sequelize } from 'sequelize';
import { initAccountLinkModel } from '../accounts/account-link.model';
import { initDeviceModel } from '../accounts/device.model';
import { initMembershipModel } from '../accounts/membership.model';
import { initRefreshTokenModel } from '../accounts/refresh-token.model';
import { initUserModel } from '../accounts/user.model';
import { initEconomicsModels } from '../economics/economics.model';
import { initMailMessageModel } from '../mail/mail-message.model';
import { initPanTestModel } from '../capture/pan-test.model';
import { initPileModel } from '../capture/pile.model';
import { initSampleModel } from '../capture/sample.model';
import { initPhotoModel } from '../photos/photo.model';
import { initSiteImageModel } from '../review/site-image.model';
import { initLabelRangeModel } from '../labels/label-range.model';
import { initLabModels } from '../lab/lab.models';
import { initOrganizationModel } from '../sites/organization.model';
import { initSiteModel } from '../sites/site.model';
import { initSyncModels } from '../sync/sync.models';
import { initTrialModel } from '../trials/trial.model';

/** Binds every model to this database, once at start-up. Add a line when a component adds a model. */
export function initModels(sequelize: Sequelize): void {
  initOrganizationModel(sequelize);
  initSiteModel(sequelize);
  initUserModel(sequelize);
  initMembershipModel(sequelize);
  initDeviceModel(sequelize);
  initRefreshTokenModel(sequelize);
  initAccountLinkModel(sequelize);
  initMailMessageModel(sequelize);
  initPileModel(sequelize);
  initSampleModel(sequelize);
  initPanTestModel(sequelize);
  initPhotoModel(sequelize);
  initSyncModels(sequelize);
  initTrialModel(sequelize);
  initEconomicsModels(sequelize);
  initSiteImageModel(sequelize);
  initLabModels(sequelize);
  initLabelRangeModel(sequelize);
}
