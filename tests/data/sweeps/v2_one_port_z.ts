! 2.0: Z values are in ohms (not normalised).
[Version] 2.0
# MHz Z RI R 50
[Number of Ports] 1
[Number of Frequencies] 2
[Network Data]
1 100 0
2 25 0
[End]
