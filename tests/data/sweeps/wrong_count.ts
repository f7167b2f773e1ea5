[Version] 2.0
# MHz S RI
[Number of Ports] 1
[Number of Frequencies] 3
[Network Data]
1 0 0
2 0 0
[End]
