# MHz S RI
[Version] 2.0
