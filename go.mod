module seatsmith

go 1.26.8
