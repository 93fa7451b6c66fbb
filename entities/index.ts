/** Every entity, listed explicitly: folder globs do not survive bundling. */
import { Lab } from './lab';
import { Membership } from './membership';
import { Rig } from './rig';
import { Trial } from './trial';
import { User } from './user';
import { BaseSchema } from './base';

export { BaseSchema, Lab, Membership, Rig, Trial, User };
export const entities = [BaseSchema, Lab, User, Membership, Rig, Trial];
