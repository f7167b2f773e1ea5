[Version] 2.0
# MHz S RI
[Number of Ports] 2
[Two-Port Data Order] 12_21
[Reference] 50
[Network Data]
