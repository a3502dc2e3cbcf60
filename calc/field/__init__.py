"""Field readings: what an engineer measured on site, judged.

- :mod:`calc.field.seawater`: chloride, ionic strength and chloride activity of seawater-type
  water from its salinity (the Ag/AgCl/seawater electrode in brackish water);
- :mod:`calc.field.electrodes`: the field reference electrode at its temperature, and whether a
  reading is plausible;
- :mod:`calc.field.measured`: a joint judged from the two parts' potentials measured on site
  (entry point ``measured``);
- :mod:`calc.field.criteria`: the catalogue of CP structures, settings and criteria (data);
- :mod:`calc.field.protection`: one reading against each kind of CP criterion;
- :mod:`calc.field.cpreading`: one CP reading judged, with its verdict (entry point ``cp``).
"""
