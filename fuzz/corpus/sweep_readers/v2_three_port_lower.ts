[Version] 2.0
# GHz Y RI
[Number of Ports] 3
[Matrix Format] Lower
[Network Data]
1 0.011 0  0.021 0 0.022 0  0.031 0 0.032 0 0.033 0
[End]
