// The 'cosmology' SheetObject: a flat Lambda-CDM model (src/physics/cosmology.ts) as a sheet value.
import { KM_S_MPC_SI } from '../physics/constants';
import { FlatLambdaCdm } from '../physics/cosmology';
import type { SheetObject } from '../sheet/sheetObject';

export class CosmologyValue implements SheetObject {
  readonly kind = 'cosmology';
  constructor(readonly model: FlatLambdaCdm) {}
  describe(): string {
    return `flat Lambda-CDM, H0 = ${(this.model.hubbleSI / KM_S_MPC_SI).toPrecision(4)} km/s/Mpc, Omega_m = ${this.model.omegaM}, radiation neglected`;
  }
  toJSON(): unknown {
    return { kind: this.kind, hubbleSI: this.model.hubbleSI, H0_km_s_Mpc: this.model.hubbleSI / KM_S_MPC_SI, omegaM: this.model.omegaM, omegaL: this.model.omegaL };
  }
}
