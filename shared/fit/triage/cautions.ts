/** The standard cautions the UI shows (PRODUCT.md). Plain words; the service never diagnoses. */

export const CAUTION_NOT_A_DIAGNOSIS =
  'Saddlestep does not diagnose. What we show are possible fit causes to check with your fitter, not a diagnosis.';

export const CAUTION_SEE_A_CLINICIAN =
  'See a doctor or physiotherapist if your pain is severe, comes on at rest or at night, comes with numbness or swelling, or started after a crash or fall.';

export const CAUTION_URGENT =
  'Numbness in the saddle or genital area that lasts after riding, new bladder or bowel problems, or a leg getting weaker: stop riding and seek urgent medical care today.';

export const CAUTION_LOCAL_LAW =
  'Follow local laws and licensed practice: fitters advise on bike position; diagnosis and treatment are for licensed clinicians.';

/** All cautions, in the order the Welcome screen and the intake show them. */
export const CAUTIONS = [CAUTION_NOT_A_DIAGNOSIS, CAUTION_SEE_A_CLINICIAN, CAUTION_URGENT, CAUTION_LOCAL_LAW] as const;
