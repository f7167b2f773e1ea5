[Version] 2.0
# MHz S RI
[Number of Ports] 1
[Network Stuff]
