/** The cautions now live with the model (pure); kept here for modules that import them from this path. */
export { cautionsFor, ELV_AC_RMS, OPEN_LOAD_OHMS, type Caution } from '../model/cautions';
