! Version 2.0, two-port with 12_21 order, a reference spanning lines,
! an information block, network and noise data.
[Version] 2.0
# MHz S RI R 50
[Number of Ports] 2
[Two-Port Data Order] 12_21
[Number of Frequencies] 2
[Number of Noise Frequencies] 1
[Reference] 50
            75
[Begin Information]
  anything at all here, [even brackets] and 1 2 3
[End Information]
[Network Data]
10 0.1 0 0.12 0 0.21 0 0.22 0
20 0.1 0.1
   0.12 0.1 0.21 0.1 0.22 0.1   ! a point may span lines in 2.0
[Noise Data]
10 2.0 0.5 30 25
[End]
